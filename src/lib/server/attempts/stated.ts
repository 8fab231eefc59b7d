// What a learner states with an upload: the subject's speed and distance for blur criteria, and the Light Plan an Assignment asks for.
import type { AssignmentSpec } from '../grading/index';
import type { AttachedLightPlan } from './light-plan';

/** Speed (m/s) and distance (m) of the subject as the learner gave them; each null when left empty. */
export interface StatedMotion {
	speed: number | null;
	distance: number | null;
}

export const STATED_LIMITS = { speed: { min: 0.1, max: 100 }, distance: { min: 0.5, max: 1000 } } as const;

/** Reads one optional number from the form: '' is "not stated"; anything else must be a number in range. */
export function readStatedNumber(text: string, what: 'speed' | 'distance'): { ok: true; value: number | null } | { ok: false; message: string } {
	const trimmed = text.trim().replace(',', '.');
	if (!trimmed) return { ok: true, value: null };
	const value = Number(trimmed);
	const { min, max } = STATED_LIMITS[what];
	const unit = what === 'speed' ? 'm/s' : 'm';
	if (!Number.isFinite(value) || value < min || value > max) {
		return { ok: false, message: `The subject's ${what} must be a number from ${min} to ${max} ${unit}, or left empty to use the assignment's.` };
	}
	return { ok: true, value };
}

/**
 * The spec this Attempt is graded by: the Assignment's, with the learner's speed and distance written into its
 * motion-blur criteria. Attempts keep their own copy of the spec, so nothing else changes.
 */
export function specWithStatedMotion(spec: AssignmentSpec, stated: StatedMotion): AssignmentSpec {
	if (stated.speed === null && stated.distance === null) return spec;
	return {
		...spec,
		criteria: spec.criteria.map((c) =>
			c.kind === 'motion-blur' ? { ...c, speed: stated.speed ?? c.speed, distance: stated.distance ?? c.distance, stated: true } : c
		)
	};
}

/** Why the upload cannot be taken without a (bigger) Light Plan, or null when the Assignment's ask is met. */
export function lightPlanProblem(spec: AssignmentSpec, plan: AttachedLightPlan | null): string | null {
	const ask = spec.lightPlan;
	if (!ask) return null;
	const lights = ask.minLights === 1 ? 'a light' : `${ask.minLights} lights`;
	if (!plan) return `This assignment asks for the Light Plan of your shot, so a mentor can judge the light: tick “Attach a Light Plan” and place ${lights}. Nothing was stored.`;
	if (plan.lights.length < ask.minLights) return `This assignment asks for a Light Plan with ${lights}; yours has ${plan.lights.length}. Add the missing light and send again. Nothing was stored.`;
	return null;
}
