// The optional Light Plan attached to an Attempt: camera, subject and 1–3 lights in metres on the plan.
import { z } from 'zod';
import { MAX_LIGHTS, PLAN_HALF, type PlanLayout } from '../../attempts/light-plan';

const metres = z.number().min(-PLAN_HALF).max(PLAN_HALF);
const point = z.object({ x: metres, y: metres }).strict();

export const lightPlanSchema = z.object({ camera: point, subject: point, lights: z.array(point).min(1).max(MAX_LIGHTS) }).strict() satisfies z.ZodType<PlanLayout>;
export type AttachedLightPlan = PlanLayout;

/** Reads the form's JSON text: '' is no plan; anything unreadable is a message. */
export function parseLightPlan(text: string): { ok: true; plan: AttachedLightPlan | null } | { ok: false; message: string } {
	if (!text.trim()) return { ok: true, plan: null };
	let value: unknown;
	try {
		value = JSON.parse(text);
	} catch {
		return { ok: false, message: 'The Light Plan could not be read. Open it again or send the frames without it.' };
	}
	const parsed = lightPlanSchema.safeParse(value);
	return parsed.success
		? { ok: true, plan: parsed.data }
		: { ok: false, message: 'The Light Plan needs a camera, a subject and one to three lights on the plan.' };
}
