// Burst Budget shows the engine's burst plan: power per frame after high-speed sync, recycle, and the lit frames.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { burstBudget } from '$lib/exposure';
import BurstBudget from './BurstBudget.svelte';
import { elementsByTestId, textOf } from './parts/ssr-html';

const show = (props: Record<string, string>) => render(BurstBudget, { props }).body;
const EXAMPLE = { power: '1/8', recycle: '2', fps: '10', frames: '10', hss: '0' };
const litIn = (body: string) => (textOf(body, 'burst-strip').match(/: lit/g) ?? []).length;

describe('Burst Budget', () => {
	it('the lesson example: 1/8 power, 2 s at full power, 10 fps → 4 of 10 frames lit, every third', () => {
		const body = show(EXAMPLE);
		const b = burstBudget({ power: 1 / 8, fullPowerRecycle: 2, fps: 10, frames: 10 });
		expect(textOf(body, 'burst-lit')).toBe(String(b.litFrames));
		expect(textOf(body, 'burst-lit')).toBe('4');
		expect(textOf(body, 'burst-recycle-now')).toBe('0.25 s');
		expect(textOf(body, 'burst-per-frame')).toBe('1/8 power');
		expect(textOf(body, 'burst-max-fps')).toBe('4.0 fps');
		expect(litIn(body)).toBe(4);
		expect(textOf(body, 'burst-strip')).toMatch(/Frame 1: lit Frame 2: dark Frame 3: dark Frame 4: lit/);
	});

	it('3 stops of high-speed sync make it full power and one lit frame (common practice, no published source)', () => {
		const body = show({ ...EXAMPLE, hss: '3' });
		expect(textOf(body, 'burst-per-frame')).toBe('full power');
		expect(textOf(body, 'burst-lit')).toBe('1');
		expect(textOf(body, 'burst-recycle-now')).toBe('2.00 s');
	});

	it('says plainly when the flash cannot give enough', () => {
		const body = show({ ...EXAMPLE, power: '1/4', hss: '3' });
		expect(textOf(body, 'burst-per-frame')).toBe('2.0× full power');
		expect(textOf(body, 'burst-over')).toMatch(/More than the flash has/);
		expect(elementsByTestId(body, 'burst-lit')).toHaveLength(0);
	});

	it('notes bad attributes and falls back instead of throwing', () => {
		const body = show({ power: 'plenty', recycle: '-2', fps: 'fast', frames: '0', hss: 'x' });
		const notice = textOf(body, 'widget-notice');
		for (const attr of ['power="plenty"', 'recycle="-2"', 'fps="fast"', 'frames="0"', 'hss="x"']) expect(notice).toContain(attr);
		expect(textOf(body, 'burst-lit')).toBe('4');
	});
});
