// One Shoot Plan for a mentor: the Light Plan, settings, story and checklist, and the decision (approve, or send back with a note).
import { error, fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { decideShootPlan, loadPlanForMentor } from '$lib/server/shoot-plans';
import { planDecisionSchema } from '$lib/forms/shoot-plan';
import type { Notice } from '$lib/forms/review';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const mentor = requireRole(event, 'mentor');
	const found = await loadPlanForMentor(Number(event.params.id));
	if (!found) error(404, { message: 'There is no such Shoot Plan.' });
	if (found.learner.id === mentor.id) error(403, { message: 'This is your own plan: another mentor decides on it.' });
	const { plan } = found;
	const seen = plan.createdAt.toISOString();
	return {
		plan: {
			id: plan.id,
			status: plan.status,
			filedAt: seen,
			decidedAt: plan.decidedAt?.toISOString() ?? null,
			lightPlan: plan.lightPlan,
			settings: plan.settings,
			story: plan.story,
			checklist: plan.checklist,
			note: plan.mentorNote
		},
		learner: { name: found.learner.name },
		assignment: { title: found.assignment.title, brief: found.assignment.brief },
		course: { title: found.course.title },
		form: await superValidate({ decision: 'approve' as const, note: '', seen }, zod4(planDecisionSchema), { errors: false })
	};
};

export const actions = {
	decide: async (event) => {
		const mentor = requireRole(event, 'mentor');
		const form = await superValidate(event.request, zod4(planDecisionSchema));
		if (!form.valid) return fail(400, { form });
		const done = await decideShootPlan(mentor, Number(event.params.id), form.data, event.url.origin);
		if (!done.ok) return message(form, { text: done.message, ok: false } satisfies Notice, { status: done.status });
		const approved = form.data.decision === 'approve';
		const mail = done.mailed ? 'The learner has been e-mailed.' : 'Saved, but the e-mail could not be sent; the learner sees it on the Assignment page.';
		return message(form, { text: `${approved ? 'Approved: their uploads are open.' : 'Sent back with your note.'} ${mail}`, ok: true } satisfies Notice);
	}
} satisfies Actions;
