// A learner files (or, while it waits, revises) the Shoot Plan of an Assignment: checked whole, stored in one statement.
import { and, desc, eq } from 'drizzle-orm';
import type { ShootPlanForm } from '$lib/forms/shoot-plan';
import { db } from '../db/index';
import { shootPlans } from '../db/schema';
import type { AssignmentSpec } from '../grading/index';
import { parseLightPlan } from '../attempts/light-plan';
import { checklistFor } from './read';

export type FileResult =
	| { ok: true; revised: boolean }
	| { ok: false; field?: 'lightPlan' | 'checked._errors'; message: string; status: 400 | 409 };

export async function fileShootPlan(userId: string, assignment: { id: number; spec: AssignmentSpec }, form: ShootPlanForm): Promise<FileResult> {
	if (!assignment.spec.shootPlan) return { ok: false, status: 400, message: 'This Assignment does not ask for a Shoot Plan; upload your frames below.' };
	const parsed = parseLightPlan(form.lightPlan);
	if (!parsed.ok) return { ok: false, status: 400, field: 'lightPlan', message: parsed.message };
	if (!parsed.plan) return { ok: false, status: 400, field: 'lightPlan', message: 'Arrange the camera, the athlete and your lights on the Light Plan.' };
	const needed = assignment.spec.lightPlan?.minLights ?? 1;
	if (parsed.plan.lights.length < needed) {
		return { ok: false, status: 400, field: 'lightPlan', message: `This Assignment needs ${needed} lights on the plan; yours has ${parsed.plan.lights.length}.` };
	}
	const checklist = checklistFor(assignment.spec);
	const missing = checklist.filter((_, i) => !form.checked.includes(i));
	if (missing.length) {
		return { ok: false, status: 400, field: 'checked._errors', message: `Confirm every line of the safety checklist before filing (${missing.length} left).` };
	}
	const values = {
		lightPlan: parsed.plan,
		settings: { shutter: form.shutter, aperture: form.aperture, iso: form.iso, flash: form.flash },
		story: form.story,
		checklist
	};
	return db.transaction(async (tx) => {
		const [latest] = await tx
			.select({ id: shootPlans.id, status: shootPlans.status })
			.from(shootPlans)
			.where(and(eq(shootPlans.userId, userId), eq(shootPlans.assignmentId, assignment.id)))
			.orderBy(desc(shootPlans.createdAt), desc(shootPlans.id))
			.limit(1)
			.for('update');
		if (latest?.status === 'approved') return { ok: false, status: 409, message: 'Your Shoot Plan is already approved: uploads are open.' } as const;
		// a plan still waiting is revised in place, so a mentor reads the newest and a double click files one plan
		if (latest?.status === 'waiting') {
			await tx.update(shootPlans).set({ ...values, createdAt: new Date() }).where(eq(shootPlans.id, latest.id));
			return { ok: true, revised: true } as const;
		}
		await tx.insert(shootPlans).values({ userId, assignmentId: assignment.id, ...values });
		return { ok: true, revised: false } as const;
	});
}
