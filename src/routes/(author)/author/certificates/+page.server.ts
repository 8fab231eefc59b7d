// Certificate rules per course: which Assignments count towards the certificate and how many must be passed.
import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { listRules, saveRules } from '$lib/server/credentials/rules';
import { rulesSchema, type RulesForm } from '$lib/forms/credentials';
import type { Notice } from '$lib/forms/review';
import type { Actions, PageServerLoad } from './$types';

const rulesFormId = (slug: string) => `rules-${slug}`;

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const courses = await listRules();
	const forms = await Promise.all(
		courses.map((c) =>
			superValidate<RulesForm, Notice>(
				{ course: c.slug, counted: c.assignments.filter((a) => a.counts).map((a) => a.id), minimum: c.minimum ?? undefined },
				zod4(rulesSchema),
				{ id: rulesFormId(c.slug), errors: false }
			)
		)
	);
	return { courses, forms: Object.fromEntries(courses.map((c, i) => [c.slug, forms[i]])) };
};

export const actions = {
	default: async (event) => {
		const author = requireRole(event, 'author');
		const form = await superValidate<RulesForm, Notice>(event.request, zod4(rulesSchema));
		if (!form.valid) return fail(400, { form });
		const result = await saveRules(author, form.data.course, form.data.counted, form.data.minimum);
		if (!result.ok) {
			if (result.field === 'minimum') return setError(form, 'minimum', result.message);
			return message(form, { text: result.message, ok: false }, { status: 400 });
		}
		return message(form, { text: result.message, ok: true });
	}
} satisfies Actions;
