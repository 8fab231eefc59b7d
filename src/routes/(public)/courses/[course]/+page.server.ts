import { error } from '@sveltejs/kit';
import { getCourseOutline } from '$lib/server/courses';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const outline = await getCourseOutline(params.course);
	if (!outline) error(404, { message: 'There is no such course.' });
	const { course, modules } = outline;
	return {
		course: {
			slug: course.slug,
			title: course.title,
			summary: course.summary,
			instructor: course.instructor,
			priceCents: course.priceCents,
			currency: course.currency
		},
		modules
	};
};
