// Exposure Split shows the daylight and the flash on the subject separately: below sync the shutter moves only the daylight.
import { render } from 'svelte/server';
import { describe, expect, it } from 'vitest';
import { ev100, flashStops, hssCost, mix } from '$lib/exposure';
import ExposureSplit from './ExposureSplit.svelte';
import { exposureSplit, flashShareOf } from './parts/split';
import { textOf } from './parts/ssr-html';
import { formatSigned } from '$lib/format';

const show = (props: Record<string, string> = {}) => render(ExposureSplit, { props }).body;
const BASE = { scene: '14', aperture: '8', shutter: '1/250', iso: '100', gn: '60', power: '1/4', distance: '3', sync: '1/250' };
// The marks behind the labels: f/8 is 2^3, the '1/250' mark 2^-8 s, '1/125' 2^-7 s, '1/1000' 2^-10 s (APEX, ASA PH2.5-1960).
const marked = { f8: 8, t250: 2 ** -8, t125: 2 ** -7, t1000: 2 ** -10 };

describe('exposure split maths', () => {
	it('puts the ambient at the scene EV minus the settings EV, and the flash by inverse square', () => {
		const r = exposureSplit({ sceneEv: 14, aperture: marked.f8, shutter: marked.t250, iso: 100, gn: 60, power: 1 / 4, distance: 3, sync: marked.t250 });
		// APEX (ASA PH2.5-1960): EV100 = log2(N²/t) = log2(64 × 256) = 14 exactly, so the daylight is correct
		expect(r.settingsEv).toBeCloseTo(14, 10);
		expect(r.ambient).toBeCloseTo(0, 10);
		// ISO 1230 guide number GN = distance × f-number: GN 60 at 1/4 power is 30, correct at f/10 for 3 m; f/8 is 2·log2(10/8) = 0.644 stop over
		expect(r.flash).toBeCloseTo(2 * Math.log2(10 / 8), 10);
		expect(r.flash).toBeCloseTo(flashStops({ gn: 60, power: 1 / 4, distance: 3, aperture: 8, iso: 100 }), 10);
		// light adds in linear units (Petschnigg et al., SIGGRAPH 2004): 2^0 + 2^0.644 = 2.563, log2 → 1.358 stops
		expect(r.subject).toBeCloseTo(Math.log2(1 + 2 ** 0.6439), 3);
		expect(r.subject).toBeCloseTo(mix({ ambientStops: 0, flashStops: r.flash }), 10);
		expect(r.share).toBeCloseTo(2 ** r.flash / (1 + 2 ** r.flash), 10);
	});

	it('below sync a slower shutter brightens only the ambient; above sync the flash pays the high-speed-sync cost', () => {
		const at = (shutter: number) =>
			exposureSplit({ sceneEv: 14, aperture: marked.f8, shutter, iso: 100, gn: 60, power: 1 / 4, distance: 3, sync: marked.t250 });
		const base = at(marked.t250);
		const slow = at(marked.t125);
		expect(slow.ambient - base.ambient).toBeCloseTo(1, 10);
		expect(slow.flash).toBe(base.flash);
		const fast = at(marked.t1000);
		expect(fast.ambient - base.ambient).toBeCloseTo(-2, 10);
		// common practice, no published source: 1 stop to enter HSS + 1 per stop above sync = 3 stops at 1/1000 s against 1/250 s
		expect(fast.hss).toBe(3);
		expect(fast.flash).toBeCloseTo(base.flash - hssCost({ shutter: marked.t1000, syncSpeed: marked.t250 }), 10);
	});

	it('counts the flash share as each light alone against both together', () => {
		expect(flashShareOf(0, 0)).toBe(0.5);
		// flash one stop above the ambient: 2 : 1, two thirds of the light
		expect(flashShareOf(-1, 0)).toBeCloseTo(2 / 3, 12);
		expect(flashShareOf(0, -Infinity)).toBe(0);
		expect(flashShareOf(-Infinity, 0)).toBe(1);
	});
});

describe('Exposure Split widget', () => {
	it('shows the engine numbers for the lesson example', () => {
		const body = show(BASE);
		const ambient = 14 - ev100({ aperture: marked.f8, shutter: marked.t250, iso: 100 });
		const flash = flashStops({ gn: 60, power: 1 / 4, distance: 3, aperture: 8, iso: 100 });
		expect(textOf(body, 'split-ambient')).toBe(`${formatSigned(ambient)} stops`);
		expect(textOf(body, 'split-flash')).toBe(`${formatSigned(flash)} stops`);
		expect(textOf(body, 'split-flash')).toBe('+0.6 stops');
		expect(textOf(body, 'split-subject')).toBe('+1.4 stops');
		expect(textOf(body, 'split-share')).toBe('61 %');
		expect(textOf(body, 'split-status')).toContain('the shutter moves only the daylight');
	});

	it('a slower shutter moves the daylight bar and leaves the flash bar', () => {
		const base = show(BASE);
		const slow = show({ ...BASE, shutter: '1/125' });
		expect(textOf(slow, 'split-ambient')).toBe('+1.0 stop');
		expect(textOf(slow, 'split-flash')).toBe(textOf(base, 'split-flash'));
	});

	it('above sync it says the flash pays too, and by how much', () => {
		const body = show({ ...BASE, shutter: '1/1000' });
		expect(textOf(body, 'split-ambient')).toBe('\u22122.0 stops');
		expect(textOf(body, 'split-status')).toContain('takes 3.0 stops off the flash');
		// 0.644 − 3 = −2.356
		expect(textOf(body, 'split-flash')).toBe('\u22122.4 stops');
	});

	it('notes bad attributes and falls back instead of throwing', () => {
		const body = show({ ...BASE, scene: 'sunny', power: 'lots' });
		expect(textOf(body, 'widget-notice')).toContain('scene="sunny"');
		expect(textOf(body, 'widget-notice')).toContain('power="lots"');
		expect(textOf(body, 'split-share')).toBe('61 %');
	});
});
