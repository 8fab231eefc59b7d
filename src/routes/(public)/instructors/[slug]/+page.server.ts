import { error } from '@sveltejs/kit';
import { getCourseOutline } from '$lib/server/courses';
import { instructorBySlug } from '$lib/server/instructors';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const profile = instructorBySlug(params.slug);
	if (!profile) error(404, { message: 'There is no such instructor.' });
	// only published courses are listed; a course being written stays off the public page
	const outlines = await Promise.all(profile.courses.map((slug) => getCourseOutline(slug)));
	const courses = outlines.flatMap((o) => (o ? [{ slug: o.course.slug, title: o.course.title, summary: o.course.summary }] : []));
	return { profile, courses };
};
