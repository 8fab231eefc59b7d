// Freeze Meter shows the engine's motion blur in pixels and the slowest marked time that keeps blur within a limit.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { freezeShutter, labelNumber, markedSeries, motionBlurPx } from '$lib/exposure';
import FreezeMeter from './FreezeMeter.svelte';
import { textOf } from './parts/ssr-html';
import { formatNumber } from '$lib/format';

const show = (props: Record<string, string>) => render(FreezeMeter, { props }).body;
const runner = { speed: '6', distance: '5', focal: '24', sensor: '36', pixels: '6000' };
const geometry = { speed: 6, distance: 5, focalLength: 24, sensorWidth: 36, imageWidth: 6000 };

describe('Freeze Meter', () => {
	it('a runner at 6 m/s, 5 m, 24 mm on a 36 mm, 6000 px sensor at 1/1000 s', () => {
		const body = show({ ...runner, shutter: '1/1000' });
		expect(textOf(body, 'freeze-blur')).toBe(`${formatNumber(motionBlurPx({ ...geometry, exposure: 1 / 1000 }), 1)} px`);
		// Thin-lens magnification m = f/(d − f) (Gaussian lens equation, from memory): 24/4976 = 0.004823;
		// 6000 mm/s × 0.004823 = 28.94 mm/s on the sensor × 6000/36 px/mm = 4823 px/s; × 1/1000 s = 4.8 px
		expect(textOf(body, 'freeze-blur')).toBe('4.8 px');
		expect(textOf(body, 'freeze-time-value')).toBe('1/1000 s');
	});

	it('halving the time halves the blur', () => {
		// Same geometry at 1/2000 s: 4823 px/s × 1/2000 s = 2.4 px (thin lens, as above)
		expect(textOf(show({ ...runner, shutter: '1/2000' }), 'freeze-blur')).toBe('2.4 px');
	});

	it('names the slowest marked time that keeps blur within 2 px', () => {
		const body = show({ ...runner, shutter: '1/1000' });
		const exact = freezeShutter({ ...geometry, maxBlurPx: 2 });
		const shown = /^(\S+) s or shorter$/.exec(textOf(body, 'freeze-needed'))?.[1] ?? '';
		const t = labelNumber(shown);
		expect(t).toBeLessThanOrEqual(exact);
		// The next slower third-stop mark would blur more than 2 px.
		const marks = markedSeries('shutter', 1 / 3).map((m) => labelNumber(m.label));
		const slower = marks[marks.indexOf(t) - 1];
		expect(slower).toBeGreaterThan(exact);
		// 2 px / 4823 px/s = 1/2411 s → 1/2500 s (thin lens, as above)
		expect(shown).toBe('1/2500');
	});

	it('a still subject needs no particular time', () => {
		const body = show({ ...runner, speed: '0', shutter: '1/60' });
		expect(textOf(body, 'freeze-blur')).toBe('0.0 px');
		expect(textOf(body, 'freeze-needed')).toBe('any time: the subject is still');
	});

	it('explains an impossible geometry instead of throwing', () => {
		const body = show({ ...runner, distance: '0.3', focal: '400', shutter: '1/1000' });
		expect(textOf(body, 'freeze-error')).toContain('must be beyond the focal length');
	});

	it('shows a notice and falls back instead of throwing on bad attributes', () => {
		const body = show({ speed: 'fast', distance: '5', focal: '24mm', sensor: '36', pixels: '0', shutter: '1/1000' });
		const notice = textOf(body, 'widget-notice');
		for (const bit of ['speed="fast"', 'focal="24mm"', 'pixels="0"']) expect(notice).toContain(bit);
		expect(textOf(body, 'freeze-blur')).toBe('4.8 px');
	});
});
