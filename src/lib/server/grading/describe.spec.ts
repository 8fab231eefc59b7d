import { describe, expect, it } from 'vitest';
import { describeCriterion } from './describe';
import { criterionSchema, CRITERION_KINDS, type Criterion } from './spec';

const EXAMPLES: Record<string, unknown> = {
	'ambient-under': { kind: 'ambient-under', stops: 2, tolerance: 0.34 },
	'subject-lift': { kind: 'subject-lift', minStops: 1 },
	'background-drop': { kind: 'background-drop', tolerance: 0.5 },
	'shutter-min': { kind: 'shutter-min', seconds: 0.001 },
	'shutter-max': { kind: 'shutter-max', seconds: 1 / 30 },
	'aperture-range': { kind: 'aperture-range', min: 5.6, max: 11 },
	'iso-max': { kind: 'iso-max', iso: 400 },
	'focal-max': { kind: 'focal-max', mm35: 35 },
	'focal-min': { kind: 'focal-min', mm35: 85 },
	'flash-evidence': { kind: 'flash-evidence' },
	'background-cooler': { kind: 'background-cooler', minMired: 60 },
	bracket: { kind: 'bracket', offsets: [0, -1, 1] },
	sync: { kind: 'sync' },
	'flash-share': { kind: 'flash-share', share: 0.5 },
	'subject-clipping': { kind: 'subject-clipping' },
	'motion-blur': { kind: 'motion-blur', maxPx: 3, speed: 6, distance: 5 },
	'mentor-judged': { kind: 'mentor-judged', look: 'a triangle of light under the far eye' }
};

const parse = (value: unknown) => criterionSchema.parse(value) as Criterion;

describe('describeCriterion', () => {
	it('says every kind in plain words', () => {
		for (const kind of CRITERION_KINDS) {
			const text = describeCriterion(parse(EXAMPLES[kind]));
			expect(text, kind).toMatch(/^[A-Z].*\.$/);
			expect(text, kind).not.toMatch(/undefined|NaN|\[object/);
		}
	});

	it('applies defaults to a criterion still being written, and says when one is incomplete', () => {
		expect(describeCriterion({ kind: 'ambient-under', stops: 2 })).toContain('2 ± ⅓ stops under');
		expect(describeCriterion({ kind: 'shutter-min' } as never)).toBe('This criterion is not complete yet: check its fields.');
	});

	it('uses the numbers of the criterion, as photographers write them', () => {
		expect(describeCriterion(parse(EXAMPLES['ambient-under']))).toBe('Set the ambient exposure 2 ± ⅓ stops under your ambient reference frame, so the background goes deep.');
		expect(describeCriterion(parse(EXAMPLES['shutter-min']))).toBe('Use a shutter speed of 1/1000 s or faster.');
		expect(describeCriterion(parse(EXAMPLES['shutter-max']))).toBe('Use a shutter speed of 1/30 s or slower.');
		expect(describeCriterion(parse(EXAMPLES['aperture-range']))).toBe('Shoot at an aperture between f/5.6 and f/11.');
		expect(describeCriterion(parse(EXAMPLES['motion-blur']))).toMatch(/^Freeze the action: a subject at 6 m\/s, 5 m away, may smear at most 3 px/);
		expect(describeCriterion(parse(EXAMPLES['mentor-judged']))).toBe('A mentor judges from the picture: a triangle of light under the far eye.');
		expect(describeCriterion(parse(EXAMPLES['focal-max']))).toBe('Use a focal length of 35 mm or wider (35 mm equivalent).');
		expect(describeCriterion(parse(EXAMPLES.bracket))).toContain('0, −1, +1 EV');
		expect(describeCriterion(parse({ kind: 'ambient-under', stops: 1.67, sceneEv: 15 }))).toContain('1⅔ ± ⅓ stops under a scene that meters EV 15');
	});
});
