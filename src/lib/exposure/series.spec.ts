import { describe, expect, it } from 'vitest';
import { ExposureInputError } from './errors';
import { labelNumber, markedSeries, nearestMarked, STOP_STEPS, type SeriesKind } from './series';

const kinds: SeriesKind[] = ['aperture', 'shutter', 'iso'];
const steps = [STOP_STEPS.full, STOP_STEPS.half, STOP_STEPS.third];
// stops of light per log2 of the value: f-number squares, time and ISO are linear
const stopsPerLog2: Record<SeriesKind, number> = { aperture: 2, shutter: 1, iso: 1 };

describe('markedSeries', () => {
	it('has the standard full-stop marks', () => {
		// common practice, no published source: the full-stop series printed on lenses and dials (from memory)
		expect(markedSeries('aperture', 1).map((m) => m.label)).toEqual([
			'f/1', 'f/1.4', 'f/2', 'f/2.8', 'f/4', 'f/5.6', 'f/8', 'f/11', 'f/16', 'f/22', 'f/32', 'f/45', 'f/64'
		]);
		expect(markedSeries('shutter', 1).map((m) => m.label)).toEqual([
			'30"', '15"', '8"', '4"', '2"', '1"', '0.5"', '1/4', '1/8', '1/15', '1/30', '1/60', '1/125', '1/250', '1/500',
			'1/1000', '1/2000', '1/4000', '1/8000', '1/16000', '1/32000'
		]);
		// ISO 12232 / ISO 5800 arithmetic speed series, full stops (from memory)
		expect(markedSeries('iso', 1).map((m) => m.label)).toEqual([
			'25', '50', '100', '200', '400', '800', '1600', '3200', '6400', '12800', '25600', '51200', '102400'
		]);
	});

	it('has exact theoretical values at each step', () => {
		// APEX, ASA PH2.5-1960: Av = 2 log2 N, so f/5.6 is 2^(5/2); Tv 8 is 2^-8 s, marked 1/250
		for (const step of steps) {
			expect(markedSeries('aperture', step).find((m) => m.label === 'f/5.6')?.value).toBeCloseTo(2 ** 2.5, 12);
			expect(markedSeries('shutter', step).find((m) => m.label === '1/250')?.value).toBeCloseTo(1 / 256, 15);
			expect(markedSeries('iso', step).find((m) => m.label === '1600')?.value).toBeCloseTo(1600, 9);
		}
		// third-stop ISO 125 is 100·2^(1/3) (ISO 12232 series, nominal 125)
		expect(markedSeries('iso', 1 / 3).find((m) => m.label === '125')?.value).toBeCloseTo(100 * 2 ** (1 / 3), 9);
	});

	it('advances by exactly one step between neighbours', () => {
		// definition of a 1, 1/2 or 1/3 stop series
		for (const kind of kinds) {
			for (const step of steps) {
				const marks = markedSeries(kind, step);
				for (let i = 1; i < marks.length; i++) {
					const d = Math.abs(Math.log2(marks[i].value / marks[i - 1].value)) * stopsPerLog2[kind];
					expect(d).toBeCloseTo(step, 9);
				}
			}
		}
	});

	it('names each mark close to its value (1/7 stop for thirds, 1/4 for halves), strictly in order, without repeats', () => {
		// common practice, no published source: guards the hand-typed label tables against slips
		for (const kind of kinds) {
			for (const step of steps) {
				const marks = markedSeries(kind, step);
				const names = marks.map((m) => labelNumber(m.label));
				expect(new Set(marks.map((m) => m.label)).size).toBe(marks.length);
				marks.forEach((m, i) => {
					const limit = step === STOP_STEPS.half ? 0.25 : 1 / 7;
					expect(Math.abs(Math.log2(names[i] / m.value)) * stopsPerLog2[kind]).toBeLessThan(limit);
					if (i > 0) expect(Math.sign(names[i] - names[i - 1])).toBe(Math.sign(m.value - marks[i - 1].value));
				});
			}
		}
	});

	it('agrees between the third-stop and half-stop tables at full stops', () => {
		// full stops appear in both nominal series (common practice); the two tables were typed separately
		for (const kind of kinds) {
			const fromThirds = markedSeries(kind, 1).map((m) => m.label);
			const fromHalves = markedSeries(kind, 1 / 2).filter((_, i) => i % 2 === 0).map((m) => m.label);
			expect(fromHalves).toEqual(fromThirds);
		}
	});

	it('rejects an unknown step or kind', () => {
		expect(() => markedSeries('aperture', 1 / 4)).toThrow(ExposureInputError);
		expect(() => markedSeries('focus' as SeriesKind, 1)).toThrow(/kind must be/);
	});
});

describe('nearestMarked', () => {
	it('maps f/5.6 and its exact value to the f/5.6 mark', () => {
		// APEX: f/5.6 is 2^(5/2) ≈ 5.657
		for (const step of steps) {
			expect(nearestMarked(5.6, 'aperture', step)).toEqual({ value: 2 ** 2.5, label: 'f/5.6' });
			expect(nearestMarked(2 ** 2.5, 'aperture', step).label).toBe('f/5.6');
		}
	});

	it('maps Exif shutter times to their marks', () => {
		// Exif stores the printed time (1/250 = 0.004 s); the mark's value is 2^-8 s (APEX Tv 8)
		expect(nearestMarked(0.004, 'shutter', 1 / 3)).toEqual({ value: 1 / 256, label: '1/250' });
		expect(nearestMarked(1 / 1600, 'shutter', 1 / 3).label).toBe('1/1600');
		expect(nearestMarked(1 / 90, 'shutter', 1 / 2).label).toBe('1/90');
		expect(nearestMarked(2, 'shutter', 1).label).toBe('2"');
	});

	it('rounds in-between values to the nearest mark of the chosen step', () => {
		// nearest in stops; the 1/3 and 1/2 series are the nominal ones above
		expect(nearestMarked(6.2, 'aperture', 1 / 3).label).toBe('f/6.3');
		expect(nearestMarked(6.2, 'aperture', 1).label).toBe('f/5.6');
		expect(nearestMarked(6.2, 'aperture', 1 / 2).label).toBe('f/6.7');
		expect(nearestMarked(1 / 300, 'shutter', 1 / 3).label).toBe('1/320');
		expect(nearestMarked(1 / 300, 'shutter', 1).label).toBe('1/250');
		expect(nearestMarked(150, 'iso', 1 / 3).label).toBe('160');
		expect(nearestMarked(1100, 'iso', 1 / 2).label).toBe('1100');
	});

	it('clamps to the ends of the series', () => {
		expect(nearestMarked(1 / 100000, 'shutter', 1).label).toBe('1/32000');
		expect(nearestMarked(0.5, 'aperture', 1 / 3).label).toBe('f/1');
		expect(nearestMarked(1e7, 'iso', 1).label).toBe('102400');
	});

	it('rejects a value that is not a positive number', () => {
		expect(() => nearestMarked(0, 'aperture', 1)).toThrow(ExposureInputError);
		expect(() => nearestMarked(-2, 'shutter', 1)).toThrow(ExposureInputError);
	});
});
