import { error } from '@sveltejs/kit';
import { getLesson } from '$lib/server/courses';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const found = await getLesson(params.course, params.lesson);
	if (!found) error(404, { message: 'There is no such lesson.' });
	const { lesson, module, course } = found;
	return {
		course: { slug: course.slug, title: course.title },
		module: { slug: module.slug, title: module.title },
		lesson: {
			slug: lesson.slug,
			title: lesson.title,
			summary: lesson.summary,
			minutes: lesson.minutes,
			freePreview: lesson.freePreview,
			contentPath: lesson.contentPath
		}
	};
};
