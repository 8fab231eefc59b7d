// A new lesson written in the browser: where it goes (module), its title, address, reading time and preview flag.
import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { asc, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { courses, modules } from '$lib/server/db/schema';
import { requireRole } from '$lib/server/guards';
import { createLesson } from '$lib/server/authoring/lessons';
import { newLessonSchema } from '$lib/forms/authoring';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const options = await db
		.select({ id: modules.id, title: modules.title, course: courses.title })
		.from(modules)
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.orderBy(asc(courses.title), asc(modules.position));
	const wanted = Number(event.url.searchParams.get('module'));
	const moduleId = options.some((m) => m.id === wanted) ? wanted : (options[0]?.id ?? 0);
	const form = await superValidate({ moduleId }, zod4(newLessonSchema), { id: 'new-lesson', errors: false });
	return { modules: options, form };
};

export const actions = {
	default: async (event) => {
		const user = requireRole(event, 'author');
		const form = await superValidate(event.request, zod4(newLessonSchema), { id: 'new-lesson' });
		if (!form.valid) return fail(400, { form });
		const created = await createLesson(form.data, user.id);
		if (!created.ok) return setError(form, created.field, created.message);
		redirect(303, `/author/lessons/${created.lessonId}?notice=created`);
	}
} satisfies Actions;
