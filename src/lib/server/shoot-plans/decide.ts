// A mentor approves a waiting Shoot Plan or sends it back with a note: once, never their own, written to the audit log.
import { eq } from 'drizzle-orm';
import type { PlanDecisionForm } from '$lib/forms/shoot-plan';
import { recordAudit } from '../audit';
import { db } from '../db/index';
import { shootPlans } from '../db/schema';
import { sendLetter } from '../mail';
import { shootPlanLetter } from '../mail-letters';
import { loadPlanForMentor } from './read';
import { assignmentPath } from '../../attempts/paths';

export type DecideResult = { ok: true; mailed: boolean } | { ok: false; status: 403 | 404 | 409; message: string };

export async function decideShootPlan(mentor: { id: string; email: string }, planId: number, form: PlanDecisionForm, origin: string): Promise<DecideResult> {
	const found = await loadPlanForMentor(planId);
	if (!found) return { ok: false, status: 404, message: 'There is no such Shoot Plan.' };
	if (found.learner.id === mentor.id) return { ok: false, status: 403, message: 'This is your own plan: another mentor decides on it.' };
	const approved = form.decision === 'approve';
	const decided = await db.transaction(async (tx) => {
		const [row] = await tx.select({ status: shootPlans.status, filedAt: shootPlans.createdAt }).from(shootPlans).where(eq(shootPlans.id, planId)).for('update');
		if (row?.status !== 'waiting' || row.filedAt.toISOString() !== form.seen) return false;
		await tx
			.update(shootPlans)
			.set({ status: approved ? 'approved' : 'returned', mentorId: mentor.id, mentorNote: form.note, decidedAt: new Date() })
			.where(eq(shootPlans.id, planId));
		await recordAudit(tx, mentor, {
			action: approved ? 'plan.approve' : 'plan.return',
			subject: `${found.learner.email}: ${found.assignment.title}`,
			detail: approved ? 'uploads opened' : 'sent back',
			reason: form.note,
			href: `/mentor/plans/${planId}`
		});
		return true;
	});
	if (!decided) return { ok: false, status: 409, message: 'Another mentor has already decided on this plan, or the learner revised it. Reload to read it as it is now.' };
	const href = `${origin}${assignmentPath(found.course.slug, found.lesson.slug, found.assignment.slug)}`;
	const mail = await sendLetter(shootPlanLetter(found.learner.email, found.learner.name, { assignment: found.assignment.title, approved, note: form.note, href }));
	return { ok: true, mailed: mail.ok };
}
