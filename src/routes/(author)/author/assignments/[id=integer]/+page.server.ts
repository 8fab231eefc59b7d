// The Assignment editor: title, brief and spec, with the spec's errors shown where they are (criteria[1].stops).
import { error, fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guards';
import { checkSpecText, openAssignment, saveAssignment } from '$lib/server/authoring/assignments';
import { rubricChoices, specFormKinds } from '$lib/server/authoring/spec-form';
import { assignmentFieldsSchema, fieldErrors } from '$lib/forms/authoring';
import type { Actions, PageServerLoad } from './$types';


export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const found = await openAssignment(Number(event.params.id));
	if (!found) error(404, { message: 'There is no such assignment.' });
	const { assignment, lesson, course } = found;
	const spec = JSON.stringify(assignment.spec, null, 2);
	return {
		assignment: { id: assignment.id, slug: assignment.slug, title: assignment.title, brief: assignment.brief, spec },
		lesson: { id: lesson.id, title: lesson.title },
		course: { title: course.title },
		check: checkSpecText(spec),
		kinds: specFormKinds(),
		rubricChoices: rubricChoices(),
		created: event.url.searchParams.get('notice') === 'created'
	};
};

export const actions = {
	default: async (event) => {
		const user = requireRole(event, 'author');
		const form = await event.request.formData();
		const values = { title: String(form.get('title') ?? ''), brief: String(form.get('brief') ?? ''), spec: String(form.get('spec') ?? '') };
		const parsed = assignmentFieldsSchema.safeParse(values);
		if (!parsed.success) return fail(400, { values, message: 'Nothing was saved: check the fields marked.', errors: fieldErrors(parsed.error), specErrors: null });
		const saved = await saveAssignment(Number(event.params.id), user.id, parsed.data);
		if (!saved.ok) return fail(400, { values, message: saved.message, errors: saved.field ? { [saved.field]: saved.message } : {}, specErrors: saved.specErrors ?? null });
		return { values, message: saved.message, ok: true };
	}
} satisfies Actions;
