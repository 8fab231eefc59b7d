// A new Assignment for a lesson: slug, title, brief and a spec that must validate before anything is stored.
import { error, fail, redirect } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { lessons } from '$lib/server/db/schema';
import { requireRole } from '$lib/server/guards';
import { checkSpecText, createAssignment } from '$lib/server/authoring/assignments';
import { rubricChoices, specFormKinds } from '$lib/server/authoring/spec-form';
import { fieldErrors, newAssignmentSchema } from '$lib/forms/authoring';
import type { Actions, PageServerLoad } from './$types';

// a starting point that validates, in the frame names every shipped assignment uses: the ambient-only
// reference frame, then the lit frame graded against it
const STARTER_SPEC = JSON.stringify(
	{
		frames: ['reference', 'lit'],
		criteria: [
			{ kind: 'ambient-under', stops: 1.5 },
			{ kind: 'subject-lift', minStops: 1 }
		]
	},
	null,
	2
);


export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const lesson = await db.query.lessons.findFirst({ where: eq(lessons.id, Number(event.params.id)) });
	if (!lesson) error(404, { message: 'There is no such lesson.' });
	return {
		lesson: { id: lesson.id, title: lesson.title },
		spec: STARTER_SPEC,
		check: checkSpecText(STARTER_SPEC),
		kinds: specFormKinds(),
		rubricChoices: rubricChoices()
	};
};

export const actions = {
	default: async (event) => {
		const user = requireRole(event, 'author');
		const form = await event.request.formData();
		const field = (name: string) => String(form.get(name) ?? '');
		const values = { slug: field('slug'), title: field('title'), brief: field('brief'), spec: field('spec') };
		const parsed = newAssignmentSchema.safeParse(values);
		if (!parsed.success) return fail(400, { values, message: 'Nothing was saved: check the fields marked.', errors: fieldErrors(parsed.error), specErrors: null });
		const created = await createAssignment(Number(event.params.id), user.id, parsed.data);
		if (!created.ok) return fail(400, { values, message: created.message, errors: created.field ? { [created.field]: created.message } : {}, specErrors: created.specErrors ?? null });
		redirect(303, `/author/assignments/${created.assignmentId}?notice=created`);
	}
} satisfies Actions;
