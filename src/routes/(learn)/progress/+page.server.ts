// The learner's progress: how close each graded attempt came to its targets, over time; and each course's certificate.
import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireUser } from '$lib/server/guards';
import { loadProgress } from '$lib/server/attempts/progress';
import { certificatePanel } from '$lib/server/credentials/register';
import { claimCredential } from '$lib/server/credentials/issue';
import { claimSchema } from '$lib/forms/credentials';
import type { Notice } from '$lib/forms/review';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const [points, certificates] = await Promise.all([loadProgress(user.id), certificatePanel(user.id)]);
	const claimForms = await Promise.all(
		certificates.map((c) => superValidate<{ course: string }, Notice>({ course: c.course.slug }, zod4(claimSchema), { id: claimFormId(c.course.slug), errors: false }))
	);
	return { points, certificates, claimForms: Object.fromEntries(certificates.map((c, i) => [c.course.slug, claimForms[i]])) };
};

/** Each course's claim button is its own form, told apart by the course. */
const claimFormId = (slug: string) => `claim-${slug}`;

export const actions = {
	/** Issues the learner's certificate for a course they have finished (or finds the one already issued). */
	claim: async (event) => {
		const user = requireUser(event);
		const form = await superValidate<{ course: string }, Notice>(event.request, zod4(claimSchema));
		if (!form.valid) return fail(400, { form });
		const result = await claimCredential(user, form.data.course, event.url.origin);
		if (!result.ok) return result.reason === 'missing' ? setError(form, 'course', result.message) : message(form, { text: result.message, ok: false }, { status: 400 });
		return message(form, { text: result.created ? 'Your certificate is ready: download it below.' : 'Your certificate was already issued: download it below.', ok: true });
	}
} satisfies Actions;
