// Falloff Ruler shows the engine's flash exposure, guide number and reach, and draws the inverse-square curve.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { falloffStops, flashAperture, flashDistance, flashStops, formatAperture, guideNumber, nearestMarked } from '$lib/exposure';
import FalloffRuler from './FalloffRuler.svelte';
import { attrOf, textOf } from './parts/ssr-html';
import { formatNumber, formatSigned } from '$lib/format';

const show = (props: Record<string, string>) => render(FalloffRuler, { props }).body;

function expected(gn: number, power: number, d: number, iso: number, aperture: number) {
	const n = nearestMarked(aperture, 'aperture').value;
	const isoMark = nearestMarked(iso, 'iso').value;
	const gnNow = guideNumber(gn, { iso: isoMark, power });
	return {
		stops: formatSigned(flashStops({ gn, power, distance: d, aperture: n, iso: isoMark })),
		gnNow: `${formatNumber(gnNow, 1)} m`,
		correct: formatAperture(nearestMarked(flashAperture(gnNow, d), 'aperture').value),
		reach: `${formatNumber(flashDistance(gnNow, n), 1)} m`,
		stepBack: formatSigned(-falloffStops(d, d + 1))
	};
}

describe('Falloff Ruler', () => {
	it('GN 60 at quarter power, 3 m, ISO 100, f/8', () => {
		const body = show({ gn: '60', power: '1/4', distance: '3', iso: '100', aperture: '8' });
		const e = expected(60, 1 / 4, 3, 100, 8);
		expect(textOf(body, 'falloff-stops')).toBe(e.stops);
		expect(textOf(body, 'falloff-gn-now')).toBe(e.gnNow);
		expect(textOf(body, 'falloff-correct-aperture')).toBe(e.correct);
		expect(textOf(body, 'falloff-reach')).toBe(e.reach);
		expect(textOf(body, 'falloff-step-back')).toBe(`${e.stepBack} stops`);
		// ISO 1230 guide number: GN = distance × f-number at ISO 100; quarter power is a quarter of the light, so GN/2 = 30.
		// Correct at 3 m is f/10; f/8 lets in (10/8)² = 1.5625× the light = +0.64 stop; 30 / 8 = 3.75 m.
		expect(textOf(body, 'falloff-gn-now')).toBe('30.0 m');
		expect(textOf(body, 'falloff-correct-aperture')).toBe('f/10');
		expect(textOf(body, 'falloff-stops')).toBe('+0.6');
		expect(textOf(body, 'falloff-reach')).toBe('3.8 m');
		// Inverse square: 3 m → 4 m is (4/3)² = 1.78× less light = −0.83 stop
		expect(textOf(body, 'falloff-step-back')).toBe('\u22120.8 stops');
	});

	it('full power at 5.5 m and f/11 sits just under correct', () => {
		const body = show({ gn: '60', power: '1/1', distance: '5.5', iso: '100', aperture: '11' });
		const e = expected(60, 1, 5.5, 100, 11);
		expect(textOf(body, 'falloff-stops')).toBe(e.stops);
		expect(textOf(body, 'falloff-correct-aperture')).toBe(e.correct);
		// ISO 1230: 60 / 5.5 = f/10.9; the f/11 mark is 2^3.5 = 11.31, so 2·log2(10.9/11.31) = −0.1 stop
		expect(textOf(body, 'falloff-stops')).toBe('\u22120.1');
	});

	it('four times the ISO doubles the guide number', () => {
		const body = show({ gn: '60', power: '1/4', distance: '3', iso: '400', aperture: '8' });
		expect(textOf(body, 'falloff-gn-now')).toBe(expected(60, 1 / 4, 3, 400, 8).gnNow);
		// ISO 1230 / APEX: exposure ∝ ISO, f-number ∝ √exposure, so ISO 400 doubles GN 30 to 60; at 3 m f/20, i.e. +2.6 stops at f/8
		expect(textOf(body, 'falloff-gn-now')).toBe('60.0 m');
		expect(textOf(body, 'falloff-stops')).toBe('+2.6');
	});

	it('takes a power between steps at the nearest manual step', () => {
		const body = show({ gn: '60', power: '0.3', distance: '3', iso: '100', aperture: '8' });
		expect(textOf(body, 'falloff-gn-now')).toBe(expected(60, 1 / 4, 3, 100, 8).gnNow);
	});

	it('draws the falloff curve with a marker at the subject', () => {
		const body = show({ gn: '60', power: '1/4', distance: '3', iso: '100', aperture: '8' });
		expect(attrOf(body, 'falloff-chart', 'aria-label')).toMatch(/two stops each time the distance doubles/);
		expect(body).toMatch(/<path d="M-?[\d.]+,-?[\d.]+(L-?[\d.]+,-?[\d.]+){50,}"/);
		expect(body).toContain('>6 m</text>');
		// the chart in words, read at its ticks. Inverse square with GN 30 at f/8 (hand-worked): 2·log2(30 / (8 × 2)) = +1.81
		// stops at 2 m, 2·log2(30 / (8 × 4)) = −0.19 at 4 m
		expect(attrOf(body, 'falloff-chart', 'aria-label')).toContain('Flash at f/8 (inverse square): +1.8 at 2 m, \u22120.2 at 4 m,');
	});

	it('shows a notice and falls back instead of throwing on bad attributes', () => {
		const body = show({ gn: 'sixty', power: 'half', distance: '-2', iso: '100', aperture: 'f/zero' });
		const notice = textOf(body, 'widget-notice');
		for (const bit of ['gn="sixty"', 'power="half"', 'distance="-2"', 'aperture="f/zero"']) expect(notice).toContain(bit);
		expect(textOf(body, 'falloff-stops')).toBe(expected(60, 1, 3, 100, 8).stops);
	});
});
