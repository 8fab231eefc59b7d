// Criterion values and targets as the verdict page prints them, and the Exif panel's rows.
import { describe, expect, it } from 'vitest';
import { emptyExifReport } from '../analysis/exif';
import { decodeFlash } from '../analysis/flash';
import { encodeGrid } from '../analysis/light-grid';
import { clippedCells, evidenceRows, exifRows, formatMeasured, formatTargetOf, formatValue } from './format-result';

describe('formatting criterion results', () => {
	it('prints measured values in their units', () => {
		expect(formatMeasured({ measured: 1.584, unit: 'stops' })).toBe('1.6 stops');
		expect(formatMeasured({ measured: -1, unit: 'stops' })).toBe('−1 stop');
		expect(formatMeasured({ measured: [0, -1.02, -2], unit: 'EV' })).toBe('0 EV, −1 EV, −2 EV');
		// marked shutter and aperture names, as cameras show them
		expect(formatMeasured({ measured: 1 / 500, unit: 's' })).toBe('1/500 s');
		expect(formatMeasured({ measured: 5.6, unit: 'f-number' })).toBe('f/5.6');
		expect(formatMeasured({ measured: 62.4, unit: 'mired' })).toBe('62 mired');
		expect(formatMeasured({ measured: null, unit: 'ISO' })).toBe('—');
		expect(formatValue(400, 'ISO')).toBe('ISO 400');
	});

	it('prints targets the way authors write them', () => {
		expect(formatTargetOf({ target: 1.5, tolerance: 0.5, unit: 'stops', comparison: 'within' })).toBe('1½ stops ± ½ stop');
		expect(formatTargetOf({ target: 2, tolerance: 0.34, unit: 'stops', comparison: 'within' })).toBe('2 stops ± ⅓ stop');
		expect(formatTargetOf({ target: 1, tolerance: null, unit: 'stops', comparison: 'at-least' })).toBe('at least 1 stop');
		expect(formatTargetOf({ target: 0.001, tolerance: null, unit: 's', comparison: 'at-most' })).toBe('1/1000 s or shorter');
		expect(formatTargetOf({ target: [0, -1, -2], tolerance: 0.34, unit: 'EV', comparison: 'within' })).toBe('0 EV, −1 EV, −2 EV (each ± ⅓ stop)');
		expect(formatTargetOf({ target: [5.6, 11], tolerance: null, unit: 'f-number', comparison: 'between' })).toBe('f/5.6 to f/11');
		expect(formatTargetOf({ target: null, tolerance: 0.5, unit: 'stops', comparison: 'within' })).toBe('what your settings say, ± ½ stop');
	});
});

describe('exifRows', () => {
	it('lists the settings in camera words and says when a tag is absent', () => {
		const exif = {
			...emptyExifReport(),
			found: true,
			exposureTime: 1 / 1500,
			fNumber: 8,
			iso: 100,
			exposureBias: -0.33,
			flash: decodeFlash(0x19),
			focalLength: 24,
			focal35: 24,
			whiteBalance: 'manual' as const,
			make: 'Stopwise Test',
			model: 'Bench One'
		};
		const rows = Object.fromEntries(exifRows(exif).map((r) => [r.label, r.value]));
		expect(rows).toMatchObject({
			Shutter: '1/1500 s',
			Aperture: 'f/8',
			ISO: '100',
			'Exposure bias': '−0.3 EV',
			// CIPA DC-008 Flash 0x19: fired, auto mode
			Flash: 'fired, auto mode',
			'Focal length': '24 mm',
			'White balance': 'manual',
			Taken: 'not recorded',
			Camera: 'Stopwise Test Bench One'
		});
	});
});

describe('the evidence beside a criterion', () => {
	it('shows the flash’s share with its ratio, the measured level beside the predicted one, and the blown share', () => {
		// a lift of 2 stops: 1 − 2^−2 = 75 % from the flash, flash log2(3) = 1.58 stops over the ambient (hand-worked)
		const rows = evidenceRows({ evidence: { lift: 2, flashShare: 0.75, ratioStops: Math.log2(3), uncertainty: 0.14, predictedLift: 1.8, blownPercent: 12 } });
		expect(rows.map((r) => r.key)).toEqual(['share', 'measured', 'predicted', 'blown']);
		expect(rows[0].value).toBe('75 % (flash 1.6 stops over the ambient)');
		expect(rows[1].value).toBe('+2 stops over the ambient alone (± 0.1 stops)');
		expect(rows[2].value).toBe('+1.8 stops over the ambient alone');
		expect(rows[3].value).toBe('12 %');
	});

	it('says "at least" for a lower bound and leaves out what was not measured', () => {
		const rows = evidenceRows({ evidence: { lift: 2.4, flashShare: 0.81, lowerBound: true, blownPercent: 0.4 } });
		expect(rows.map((r) => r.value)).toEqual(['at least 81 %', 'at least +2.4 stops over the ambient alone']);
		expect(evidenceRows({})).toEqual([]);
	});

	it('says "at most" for an upper bound and gives a range when the ratio is known only within one', () => {
		// flash 3 stops under the ambient: 1 / (1 + 2^3) = 11 % of the light (hand-worked)
		const bound = evidenceRows({ evidence: { lift: 0.17, flashShare: 1 / 9, ratioStops: -3, upperBound: true } });
		expect(bound.map((r) => r.value)).toEqual(['at most 11 % (flash 3 stops under the ambient)', 'at most +0.2 stops over the ambient alone']);
		// from 0 to +2 stops: 1 / (1 + 1) = 50 % to 1 / (1 + 2^−2) = 80 % (hand-worked)
		const range = evidenceRows({ evidence: { lift: 1.5, flashShare: 0.65, uncertainty: 0.6, ratioRange: [0, 2] } });
		expect(range[0].value).toBe('50 % to 80 % (flash from 0 stops over the ambient to 2 stops over the ambient)');
		const open = evidenceRows({ evidence: { lift: 0.2, flashShare: 0.13, uncertainty: 0.2, ratioRange: [null, -2] } });
		expect(open[0].value).toBe('at most 20 % (flash at least 2 stops under the ambient)');
	});
});

describe('the clipped areas of a frame', () => {
	it('lists the cells a quarter or more clipped, row by row, from the stored grid', () => {
		const n = 6;
		const grid = encodeGrid({
			cols: 3,
			rows: 2,
			r: new Float32Array(n).fill(0.2),
			g: new Float32Array(n).fill(0.2),
			b: new Float32Array(n).fill(0.2),
			clipped: Float32Array.from([0, 0.3, 0, 0.2, 0, 1]),
			crushed: new Float32Array(n)
		});
		expect(clippedCells(grid)).toEqual({ cols: 3, rows: 2, cells: [1, 5] });
		expect(clippedCells({ ...grid, clipped: 'AAA=' })).toBeNull();
	});
});
