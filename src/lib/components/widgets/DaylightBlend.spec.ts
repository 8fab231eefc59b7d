// Daylight Blend adds sky and flash on the face with the engine's mix, and reads the share, key to fill and rim from it.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { mix } from '$lib/exposure';
import DaylightBlend from './DaylightBlend.svelte';
import { daylightBlend } from './parts/blend';
import { textOf } from './parts/ssr-html';

const show = (props: Record<string, string>) => render(DaylightBlend, { props }).body;

describe('daylight blend maths', () => {
	it('the lesson example at f/11: sky −3, flash log2(7/8) → a correct face, 7/8 flash, 8:1', () => {
		// light adds in linear units (Petschnigg et al., SIGGRAPH 2004): 2^−3 + 7/8 = 1, a correct exposure
		const flash = Math.log2(7 / 8);
		const r = daylightBlend({ rim: 0, shade: -3, flash, background: -1 });
		expect(r.face).toBeCloseTo(0, 12);
		expect(r.face).toBe(mix({ ambientStops: -3, flashStops: flash }));
		expect(r.share).toBeCloseTo(7 / 8, 12);
		expect(r.keyToFillStops).toBeCloseTo(3, 12);
		expect(r.keyToFillRatio).toBeCloseTo(8, 10);
		expect(r.rimOverFace).toBeCloseTo(0, 12);
		expect(r.backgroundUnderFace).toBeCloseTo(-1, 12);
	});

	it('one stop wider: sky −2, flash log2(3/4) → 75 % flash and 4:1', () => {
		const r = daylightBlend({ rim: 1, shade: -2, flash: Math.log2(3 / 4), background: 0 });
		expect(r.face).toBeCloseTo(0, 12);
		expect(r.share).toBeCloseTo(0.75, 12);
		expect(r.keyToFillRatio).toBeCloseTo(4, 10);
		expect(r.rimOverFace).toBeCloseTo(1, 12);
	});

	it('equal flash and sky is half each, and the face one stop up', () => {
		const r = daylightBlend({ rim: 0, shade: -1, flash: -1, background: -1 });
		expect(r.share).toBe(0.5);
		expect(r.face).toBeCloseTo(0, 12);
	});
});

describe('Daylight Blend widget', () => {
	it('shows the example in the lesson (flash −0.2 rounds the 7/8 share to 87 %)', () => {
		const body = show({ rim: '0', shade: '-3', flash: '-0.2', background: '-1' });
		const r = daylightBlend({ rim: 0, shade: -3, flash: -0.2, background: -1 });
		expect(textOf(body, 'blend-share')).toBe(`${Math.round(100 * r.share)} %`);
		// 2^−0.2 = 0.871; 0.871 / (0.871 + 0.125) = 0.874
		expect(textOf(body, 'blend-share')).toBe('87 %');
		expect(textOf(body, 'blend-face')).toBe('0.0 stops');
		expect(textOf(body, 'blend-ratio')).toMatch(/^8\.0:1/);
		expect(body).toContain('the flash is the key');
	});

	it('reads a rim two stops over the face as likely to clip', () => {
		const body = show({ rim: '2', shade: '-3', flash: '-0.2', background: '-1' });
		expect(textOf(body, 'blend-rim-face')).toBe('+2.0 stops');
		expect(body).toContain('likely to clip to white');
	});

	it('notes bad attributes and falls back instead of throwing', () => {
		const body = show({ rim: 'bright', shade: '-40', flash: '', background: 'x' });
		const notice = textOf(body, 'widget-notice');
		expect(notice).toContain('rim="bright"');
		expect(notice).toContain('shade="-40"');
		expect(textOf(body, 'blend-share')).toBe('87 %');
	});
});
