// The Assignment editor: title, brief and spec, with the spec's errors shown where they are (criteria[1].stops).
import { error } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { checkSpecText, openAssignment, saveAssignment } from '$lib/server/authoring/assignments';
import { rubricChoices, specFormKinds } from '$lib/server/authoring/spec-form';
import { assignmentFieldsSchema, type AssignmentFieldsInput, type AssignmentNotice } from '$lib/forms/authoring';
import type { Actions, PageServerLoad } from './$types';


export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const found = await openAssignment(Number(event.params.id));
	if (!found) error(404, { message: 'There is no such assignment.' });
	const { assignment, lesson, course } = found;
	const spec = JSON.stringify(assignment.spec, null, 2);
	const created = event.url.searchParams.get('notice') === 'created';
	const form = await superValidate<AssignmentFieldsInput, AssignmentNotice>({ title: assignment.title, brief: assignment.brief, spec }, zod4(assignmentFieldsSchema), {
		id: 'assignment',
		errors: false
	});
	if (created) form.message = { ok: true, text: 'Assignment created.' };
	return {
		assignment: { id: assignment.id, slug: assignment.slug, title: assignment.title },
		form,
		lesson: { id: lesson.id, title: lesson.title },
		course: { title: course.title },
		check: checkSpecText(spec),
		kinds: specFormKinds(),
		rubricChoices: rubricChoices()
	};
};

export const actions = {
	default: async (event) => {
		const user = requireRole(event, 'author');
		const form = await superValidate<AssignmentFieldsInput, AssignmentNotice>(event.request, zod4(assignmentFieldsSchema), { id: 'assignment' });
		if (!form.valid) return message(form, { ok: false, text: 'Nothing was saved: check the fields marked.' }, { status: 400 });
		const saved = await saveAssignment(Number(event.params.id), user.id, form.data);
		if (!saved.ok) {
			if (saved.field === 'spec') setError(form, 'spec', saved.message);
			return message(form, { ok: false, text: saved.message, specErrors: saved.specErrors }, { status: 400 });
		}
		return message(form, { ok: true, text: saved.message });
	}
} satisfies Actions;
