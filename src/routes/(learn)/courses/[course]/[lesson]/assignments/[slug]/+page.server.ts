// An Assignment's upload page and the learner's history of attempts at it (enrolled learners and staff).
import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { shootPlanSchema } from '$lib/forms/shoot-plan';
import type { Notice } from '$lib/forms/review';
import { checklistFor, fileShootPlan, latestPlan } from '$lib/server/shoot-plans';
import { requireUser } from '$lib/server/guards';
import { actionAccess, decideAccess, guardedAssignment } from '$lib/server/lessons/access';
import { findLessonAssignment } from '$lib/server/attempts/assignment';
import { listAttemptsFor } from '$lib/server/attempts/history';
import { maxUploadBytes } from '$lib/server/attempts/limits';
import { describeCriterion, type AssignmentSpec } from '$lib/server/grading';
import type { Actions, PageServerLoad, RequestEvent } from './$types';

async function openAssignment(event: RequestEvent) {
	const user = requireUser(event);
	const { course, lesson, slug } = event.params;
	const found = await findLessonAssignment(course, lesson, slug);
	actionAccess(await decideAccess(user, guardedAssignment(found)), { url: event.url, courseSlug: course, missing: 'There is no such assignment.' });
	return { user, assignment: found! };
}

async function shootPlanState(userId: string, assignment: { id: number; spec: AssignmentSpec | null }) {
	if (!assignment.spec?.shootPlan) return null;
	const plan = await latestPlan(userId, assignment.id);
	const form = await superValidate(
		plan && plan.status !== 'approved'
			? { lightPlan: JSON.stringify(plan.lightPlan), ...plan.settings, story: plan.story, checked: [] }
			: { lightPlan: '', shutter: '', aperture: '', iso: 100, flash: '', story: '', checked: [] },
		zod4(shootPlanSchema),
		{ id: 'shoot-plan', errors: false }
	);
	return {
		checklist: checklistFor(assignment.spec),
		minLights: assignment.spec.lightPlan?.minLights ?? 1,
		filed: plan
			? {
					status: plan.status,
					filedAt: plan.createdAt.toISOString(),
					decidedAt: plan.decidedAt?.toISOString() ?? null,
					mentor: plan.mentorName,
					note: plan.mentorNote,
					settings: plan.settings,
					story: plan.story,
					lightPlan: plan.lightPlan
				}
			: null,
		form
	};
}

export const load: PageServerLoad = async (event) => {
	const { user, assignment } = await openAssignment(event);
	const shootPlan = await shootPlanState(user.id, assignment);
	const blur = assignment.spec?.criteria.find((c) => c.kind === 'motion-blur');
	return {
		assignment: {
			slug: assignment.slug,
			title: assignment.title,
			brief: assignment.brief,
			frames: assignment.spec?.frames ?? [],
			criteria: assignment.spec?.criteria.map(describeCriterion) ?? [],
			open: assignment.spec !== null && (!shootPlan || shootPlan.filed?.status === 'approved'),
			motion: blur ? { speed: blur.speed, distance: blur.distance } : null,
			planLights: assignment.spec?.lightPlan?.minLights ?? null
		},
		lesson: assignment.lesson,
		course: { slug: assignment.course.slug, title: assignment.course.title },
		shootPlan,
		history: await listAttemptsFor(user.id, assignment.id),
		maxUploadBytes: maxUploadBytes()
	};
};

export const actions = {
	filePlan: async (event) => {
		const { user, assignment } = await openAssignment(event);
		const form = await superValidate(event.request, zod4(shootPlanSchema));
		if (!form.valid) return fail(400, { form });
		if (!assignment.spec) return message(form, { text: 'This Assignment is closed while its criteria are being fixed.', ok: false } satisfies Notice, { status: 409 });
		const filed = await fileShootPlan(user.id, { id: assignment.id, spec: assignment.spec }, form.data);
		if (!filed.ok) {
			if (filed.field) return setError(form, filed.field, filed.message);
			return message(form, { text: filed.message, ok: false } satisfies Notice, { status: filed.status });
		}
		return message(form, {
			text: filed.revised ? 'Plan revised. A mentor reads the newest version.' : 'Plan filed. A mentor will read it; you get an e-mail when it is decided.',
			ok: true
		} satisfies Notice);
	}
} satisfies Actions;
