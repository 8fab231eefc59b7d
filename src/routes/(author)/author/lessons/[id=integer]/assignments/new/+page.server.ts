// A new Assignment for a lesson: slug, title, brief and a spec that must validate before anything is stored.
import { error, redirect } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { lessons } from '$lib/server/db/schema';
import { requireRole } from '$lib/server/guards';
import { checkSpecText, createAssignment } from '$lib/server/authoring/assignments';
import { rubricChoices, specFormKinds } from '$lib/server/authoring/spec-form';
import { newAssignmentSchema, type AssignmentNotice, type NewAssignmentInput } from '$lib/forms/authoring';
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
	const form = await superValidate<NewAssignmentInput, AssignmentNotice>({ spec: STARTER_SPEC }, zod4(newAssignmentSchema), { id: 'new-assignment', errors: false });
	return {
		lesson: { id: lesson.id, title: lesson.title },
		form,
		check: checkSpecText(STARTER_SPEC),
		kinds: specFormKinds(),
		rubricChoices: rubricChoices()
	};
};

export const actions = {
	default: async (event) => {
		const user = requireRole(event, 'author');
		const form = await superValidate<NewAssignmentInput, AssignmentNotice>(event.request, zod4(newAssignmentSchema), { id: 'new-assignment' });
		if (!form.valid) return message(form, { ok: false, text: 'Nothing was saved: check the fields marked.' }, { status: 400 });
		const created = await createAssignment(Number(event.params.id), user.id, form.data);
		if (!created.ok) {
			if (created.field === 'slug' || created.field === 'spec') setError(form, created.field, created.message);
			return message(form, { ok: false, text: created.message, specErrors: created.specErrors }, { status: 400 });
		}
		redirect(303, `/author/assignments/${created.assignmentId}?notice=created`);
	}
} satisfies Actions;
