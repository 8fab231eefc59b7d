import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
	apertureFor,
	apertureValue,
	ev100,
	evFromLuminance,
	luminanceFromEv,
	meteredEv,
	shutterFor,
	speedValue,
	stopsBetween,
	timeValue
} from './apex';
import { ExposureInputError } from './errors';

const aperture = fc.double({ min: 0.7, max: 90, noNaN: true });
const shutter = fc.double({ min: 1 / 32000, max: 60, noNaN: true });
const iso = fc.double({ min: 25, max: 409600, noNaN: true });
const settings = fc.record({ aperture, shutter, iso });

describe('ev100', () => {
	it('is 0 at f/1, 1 s, ISO 100', () => {
		// APEX, ASA PH2.5-1960: Ev = Av + Tv = 0 + 0 by definition
		expect(ev100({ aperture: 1, shutter: 1, iso: 100 })).toBe(0);
	});

	it('gives EV 15 for f/16 at 1/125 s, ISO 100', () => {
		// published EV tables (exposure value system, e.g. 1/125 s at f/16 = EV 15 on nominal marks)
		expect(ev100({ aperture: 16, shutter: 1 / 125, iso: 100 })).toBeCloseTo(15, 1);
		// with the exact theoretical 1/128 s the same row is exactly 15
		expect(ev100({ aperture: 16, shutter: 1 / 128, iso: 100 })).toBeCloseTo(15, 12);
	});

	it('matches more published EV table rows', () => {
		// published EV tables: f/8 1/60 s → 12, f/2 1/4 s → 4, f/1.4 1/2 s → 2 (exact with theoretical marks)
		expect(ev100({ aperture: 8, shutter: 1 / 64, iso: 100 })).toBeCloseTo(12, 12);
		expect(ev100({ aperture: 2, shutter: 1 / 4, iso: 100 })).toBeCloseTo(4, 12);
		expect(ev100({ aperture: Math.SQRT2, shutter: 1 / 2, iso: 100 })).toBeCloseTo(2, 12);
	});

	it('refers other ISO speeds back to ISO 100', () => {
		// ISO 2720 / APEX: doubling speed S needs one stop less exposure, so the same scene reads the same EV100
		expect(ev100({ aperture: 16, shutter: 1 / 512, iso: 400 })).toBeCloseTo(15, 12);
		expect(ev100({ aperture: 16, shutter: 1 / 128, iso: 200 })).toBeCloseTo(14, 12);
	});

	it('equals Av + Tv − (Sv − 5) with the Exif speed value', () => {
		// CIPA DC-008 Annex C: Av = 2 log2 N, Tv = −log2 t, Sv = log2(S/3.125), so Sv(100) = 5
		fc.assert(
			fc.property(settings, (s) => {
				const apex = apertureValue(s.aperture) + timeValue(s.shutter) - (speedValue(s.iso) - 5);
				expect(ev100(s)).toBeCloseTo(apex, 9);
			})
		);
	});

	it('rejects impossible settings with a clear error', () => {
		expect(() => ev100({ aperture: 0, shutter: 1, iso: 100 })).toThrow(ExposureInputError);
		expect(() => ev100({ aperture: 2, shutter: -1, iso: 100 })).toThrow(/shutter must be greater than 0/);
		expect(() => ev100({ aperture: 2, shutter: 1, iso: NaN })).toThrow(/iso must be a finite number/);
		expect(() => ev100(null as never)).toThrow(ExposureInputError);
	});
});

describe('APEX values', () => {
	it('follow the APEX definitions', () => {
		// APEX, ASA PH2.5-1960 (Av, Tv) and CIPA DC-008 Annex C (Sv pinned to Exif)
		expect(apertureValue(1)).toBe(0);
		expect(apertureValue(2)).toBeCloseTo(2, 12);
		expect(apertureValue(Math.SQRT2)).toBeCloseTo(1, 12);
		expect(timeValue(1 / 1024)).toBeCloseTo(10, 12);
		expect(speedValue(100)).toBeCloseTo(5, 12);
		expect(speedValue(200)).toBeCloseTo(6, 12);
		// PH2.5-1960's Sv = log2(0.3·S) gives 4.91 at ISO 100; we pin the Exif definition instead
		expect(Math.abs(speedValue(100) - Math.log2(0.3 * 100))).toBeGreaterThan(0.05);
	});
});

describe('stopsBetween', () => {
	const base = { aperture: 8, shutter: 1 / 250, iso: 100 };

	it('is positive when the second setting is darker', () => {
		// APEX, ASA PH2.5-1960: halving time adds one Tv; closing one stop adds one Av; halving speed loses a stop
		expect(stopsBetween(base, { ...base, shutter: 1 / 500 })).toBeCloseTo(1, 12);
		expect(stopsBetween(base, { ...base, aperture: 8 * Math.SQRT2 })).toBeCloseTo(1, 12);
		expect(stopsBetween(base, { ...base, iso: 200 })).toBeCloseTo(-1, 12);
		expect(stopsBetween(base, { aperture: 16, shutter: 1 / 1000, iso: 100 })).toBeCloseTo(4, 12);
	});

	it('is antisymmetric', () => {
		// algebra of logarithms
		fc.assert(
			fc.property(settings, settings, (a, b) => {
				expect(stopsBetween(a, b) + stopsBetween(b, a)).toBeCloseTo(0, 9);
			})
		);
	});

	it('keeps EV under reciprocity: half the time and one stop wider', () => {
		// APEX, ASA PH2.5-1960: Av + Tv constant along a reciprocity line
		fc.assert(
			fc.property(settings, (s) => {
				const wider = { ...s, aperture: s.aperture / Math.SQRT2, shutter: s.shutter / 2 };
				expect(stopsBetween(s, wider)).toBeCloseTo(0, 9);
			})
		);
	});
});

describe('meteredEv', () => {
	it('adds the exposure bias to the frame EV', () => {
		// Exif ExposureBiasValue (CIPA DC-008): +1 means one stop more exposure than the meter's; the meter's EV is one higher
		const frame = { aperture: 8, shutter: 1 / 256, iso: 100 };
		expect(meteredEv({ ...frame, exposureBias: 0 })).toBeCloseTo(14, 12);
		expect(meteredEv({ ...frame, exposureBias: 1 })).toBeCloseTo(15, 12);
		expect(meteredEv({ ...frame, exposureBias: -2 })).toBeCloseTo(12, 12);
		expect(meteredEv(frame)).toBeCloseTo(14, 12);
	});

	it('recovers the metered setting: a frame one stop darker than metered with bias −1 reads the metered EV', () => {
		// consistency with ev100 (definition of exposure compensation)
		const metered = { aperture: 5.6, shutter: 1 / 500, iso: 200 };
		const darker = { ...metered, shutter: 1 / 1000 };
		expect(meteredEv({ ...darker, exposureBias: -1 })).toBeCloseTo(ev100(metered), 12);
	});

	it('rejects a non-numeric bias', () => {
		expect(() => meteredEv({ aperture: 8, shutter: 1, iso: 100, exposureBias: Number.NaN })).toThrow(ExposureInputError);
	});
});

describe('shutterFor and apertureFor', () => {
	it('invert ev100', () => {
		// algebra: solving log2(N²/t) − log2(S/100) = EV for t and for N
		fc.assert(
			fc.property(settings, (s) => {
				const ev = ev100(s);
				expect(shutterFor({ ev100: ev, aperture: s.aperture, iso: s.iso }) / s.shutter).toBeCloseTo(1, 9);
				expect(apertureFor({ ev100: ev, shutter: s.shutter, iso: s.iso }) / s.aperture).toBeCloseTo(1, 9);
			})
		);
	});

	it('gives the sunny-16 shutter', () => {
		// published EV tables: EV 15 at f/16, ISO 100 → 1/128 s (marked 1/125)
		expect(shutterFor({ ev100: 15, aperture: 16 })).toBeCloseTo(1 / 128, 12);
	});
});

describe('luminance and EV', () => {
	it('follows the reflected-meter equation with K = 12.5', () => {
		// ISO 2720:1974: N²/t = L·S/K; table of EV100 vs luminance at K = 12.5: EV 0 → 0.125 cd/m², EV 15 → 4096 cd/m²
		expect(luminanceFromEv(0)).toBeCloseTo(0.125, 12);
		expect(luminanceFromEv(15)).toBeCloseTo(4096, 9);
		expect(luminanceFromEv(3)).toBeCloseTo(1, 12);
		expect(evFromLuminance(4096)).toBeCloseTo(15, 12);
	});

	it('agrees with ev100 for the settings the equation prescribes', () => {
		// ISO 2720:1974: settings satisfying N²/t = L·S/K read EV100 = log2(L·100/K)
		const L = 2000;
		const s = { aperture: 11, shutter: (11 * 11 * 12.5) / (L * 400), iso: 400 };
		expect(ev100(s)).toBeCloseTo(evFromLuminance(L), 9);
	});
});
