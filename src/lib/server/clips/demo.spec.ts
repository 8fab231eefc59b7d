// The demo clip's timeline and captions: stops under follow the aperture steps f/11 → f/16 → f/22, the strobe comes up last.
import { describe, expect, it } from 'vitest';
import { checkCaptions } from '../../clips/webvtt';
import { DEMO_CAPTIONS, flashPowerAt, stopsUnderAt } from './demo';

describe('demo clip', () => {
	it('holds at the meter, one stop and two stops under (f/11, f/16, f/22: nominal whole stops, Av = 2 log2 N, APEX, ASA PH2.5-1960)', () => {
		expect(stopsUnderAt(1)).toBe(0);
		expect(stopsUnderAt(3)).toBe(1);
		expect(stopsUnderAt(5)).toBe(2);
		expect(stopsUnderAt(7.9)).toBe(2);
	});

	it('fires no strobe until the ambient is two stops under, then reaches full power', () => {
		expect(flashPowerAt(5)).toBe(0);
		expect(flashPowerAt(5.5)).toBeCloseTo(1 / 64, 6);
		expect(flashPowerAt(7.5)).toBe(1);
	});

	it('has captions that are valid WebVTT and cover the whole clip', () => {
		const checked = checkCaptions(DEMO_CAPTIONS);
		expect(checked).toMatchObject({ ok: true, lastEnd: 8 });
	});
});
