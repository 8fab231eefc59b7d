// Criterion values and targets as the verdict page prints them, and the Exif panel's rows.
import { describe, expect, it } from 'vitest';
import { emptyExifReport } from '../analysis/exif';
import { decodeFlash } from '../analysis/flash';
import { exifRows, formatMeasured, formatTargetOf, formatValue } from './format-result';

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
