// A new lesson written in the browser: where it goes (module), its title, address, reading time and preview flag.
import { fail, redirect } from '@sveltejs/kit';
import { asc, eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { courses, modules } from '$lib/server/db/schema';
import { requireRole } from '$lib/server/guards';
import { createLesson } from '$lib/server/authoring/lessons';
import { fieldErrors, newLessonSchema } from '$lib/forms/authoring';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const options = await db
		.select({ id: modules.id, title: modules.title, course: courses.title })
		.from(modules)
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.orderBy(asc(courses.title), asc(modules.position));
	const wanted = Number(event.url.searchParams.get('module'));
	return { modules: options, moduleId: options.some((m) => m.id === wanted) ? wanted : (options[0]?.id ?? null) };
};

export const actions = {
	default: async (event) => {
		const user = requireRole(event, 'author');
		const raw = Object.fromEntries(await event.request.formData());
		const values = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, typeof v === 'string' ? v : '']));
		const parsed = newLessonSchema.safeParse(values);
		if (!parsed.success) return fail(400, { values, errors: fieldErrors(parsed.error) });
		const created = await createLesson(parsed.data, user.id);
		if (!created.ok) return fail(400, { values, errors: { [created.field]: created.message } });
		redirect(303, `/author/lessons/${created.lessonId}?notice=created`);
	}
} satisfies Actions;
