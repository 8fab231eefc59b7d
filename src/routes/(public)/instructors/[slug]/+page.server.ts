import { error } from '@sveltejs/kit';
import { instructorBySlug, publishedCoursesOf } from '$lib/server/instructors';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params }) => {
	const profile = instructorBySlug(params.slug);
	if (!profile) error(404, { message: 'There is no such instructor.' });
	return { profile, courses: await publishedCoursesOf(profile) };
};
