// How far a criterion result lands outside its target, in stops, and the per-attempt summary the progress chart draws.
import { describe, expect, it } from 'vitest';
import type { CriterionResult } from '../grading/index';
import { missInStops, summariseResult } from './progress';

const result = (r: Partial<CriterionResult>): CriterionResult => ({
	kind: 'ambient-under',
	verdict: 'pass',
	measured: 0,
	target: 0,
	tolerance: null,
	unit: 'stops',
	comparison: 'within',
	message: '',
	missing: [],
	frames: [],
	...r
});

describe('missInStops', () => {
	it('is 0 inside the tolerance and the distance beyond it outside', () => {
		expect(missInStops(result({ measured: 1.7, target: 1.5, tolerance: 0.5 }))).toBe(0);
		expect(missInStops(result({ measured: 0.5, target: 1.5, tolerance: 0.5 }))).toBeCloseTo(0.5, 9);
		expect(missInStops(result({ kind: 'subject-lift', measured: 0.25, target: 1, comparison: 'at-least' }))).toBeCloseTo(0.75, 9);
	});

	it('turns shutter, ISO and aperture limits into stops', () => {
		// APEX, ASA PH2.5-1960: 1/250 s is one stop longer than 1/500 s
		expect(missInStops(result({ kind: 'shutter-min', unit: 's', measured: 1 / 250, target: 1 / 500, comparison: 'at-most' }))).toBeCloseTo(1, 9);
		// ISO 400 is two stops over ISO 100
		expect(missInStops(result({ kind: 'iso-max', unit: 'ISO', measured: 400, target: 100, comparison: 'at-most' }))).toBeCloseTo(2, 9);
		// f/4 is two stops wider than f/8 (each stop is a factor √2 in N)
		expect(missInStops(result({ kind: 'aperture-range', unit: 'f-number', measured: 4, target: [8, 16], comparison: 'between' }))).toBeCloseTo(2, 9);
	});

	it('takes the worst frame of a bracket, and has no answer for millimetres, mireds or unmeasured results', () => {
		expect(missInStops(result({ kind: 'bracket', unit: 'EV', measured: [0, -1, -1.5], target: [0, -1, -2], tolerance: 0.34 }))).toBeCloseTo(0.16, 9);
		expect(missInStops(result({ kind: 'focal-max', unit: 'mm', measured: 50, target: 35, comparison: 'at-most' }))).toBeNull();
		expect(missInStops(result({ kind: 'background-cooler', unit: 'mired', measured: 10, target: 60, comparison: 'at-least' }))).toBeNull();
		expect(missInStops(result({ measured: null, verdict: 'unknown' }))).toBeNull();
	});
});

describe('summariseResult', () => {
	it('splits the worst miss into ambient and flash criteria and counts criteria met', () => {
		const summary = summariseResult([
			result({ measured: 0.5, target: 1.5, tolerance: 0.5, verdict: 'fail' }),
			result({ kind: 'subject-lift', measured: 0.5, target: 1, comparison: 'at-least', verdict: 'fail' }),
			result({ kind: 'flash-evidence', measured: null, target: 0.5, comparison: 'at-least', verdict: 'unknown' }),
			result({ kind: 'shutter-min', unit: 's', measured: 1 / 2000, target: 1 / 1000, comparison: 'at-most' })
		]);
		expect(summary).toEqual({ ambientMiss: 0.5, flashMiss: 0.5, met: 1, total: 4 });
		expect(summariseResult([])).toEqual({ ambientMiss: null, flashMiss: null, met: 0, total: 0 });
	});
});
