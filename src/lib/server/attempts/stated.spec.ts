// Stated speed and distance are read plainly and written only into motion-blur criteria; the Light Plan ask names what is missing.
import { describe, expect, it } from 'vitest';
import { validateSpec, type AssignmentSpec } from '../grading/index';
import { lightPlanProblem, readStatedNumber, specWithStatedMotion } from './stated';

function spec(input: unknown): AssignmentSpec {
	const r = validateSpec(input);
	if (!r.ok) throw new Error(JSON.stringify(r.errors));
	return r.spec;
}

const FREEZE = spec({
	frames: ['reference', 'lit'],
	criteria: [
		{ kind: 'motion-blur', maxPx: 3, speed: 6, distance: 5 },
		{ kind: 'shutter-min', seconds: 0.001 }
	]
});
const point = { x: 0, y: 0 };

describe('stated numbers', () => {
	it('reads empty as not stated, a comma as a decimal point, and refuses the rest', () => {
		expect(readStatedNumber('', 'speed')).toEqual({ ok: true, value: null });
		expect(readStatedNumber(' 4,5 ', 'speed')).toEqual({ ok: true, value: 4.5 });
		expect(readStatedNumber('fast', 'speed')).toMatchObject({ ok: false, message: expect.stringContaining('m/s') });
		expect(readStatedNumber('0', 'distance')).toMatchObject({ ok: false });
		expect(readStatedNumber('2000', 'distance')).toMatchObject({ ok: false, message: expect.stringContaining('0.5 to 1000 m') });
	});

	it('writes them into motion-blur criteria only, marked as stated; nothing stated leaves the spec as it was', () => {
		const out = specWithStatedMotion(FREEZE, { speed: 3, distance: null });
		expect(out.criteria[0]).toEqual({ kind: 'motion-blur', maxPx: 3, speed: 3, distance: 5, stated: true });
		expect(out.criteria[1]).toBe(FREEZE.criteria[1]);
		expect(specWithStatedMotion(FREEZE, { speed: null, distance: null })).toBe(FREEZE);
		// the Assignment's own spec is not changed
		expect(FREEZE.criteria[0]).toEqual({ kind: 'motion-blur', maxPx: 3, speed: 6, distance: 5 });
	});
});

describe('Light Plan asked for', () => {
	const asks = spec({ frames: ['lit'], lightPlan: { minLights: 2 }, criteria: [{ kind: 'mentor-judged', look: 'two lights' }] });

	it('is no problem when the spec does not ask', () => {
		expect(lightPlanProblem(FREEZE, null)).toBeNull();
	});

	it('names what is missing', () => {
		expect(lightPlanProblem(asks, null)).toMatch(/place 2 lights/);
		expect(lightPlanProblem(asks, { camera: point, subject: point, lights: [point] })).toMatch(/yours has 1/);
		expect(lightPlanProblem(asks, { camera: point, subject: point, lights: [point, point] })).toBeNull();
	});
});
