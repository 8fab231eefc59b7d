import { listCourses } from '$lib/server/courses';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const courses = await listCourses();
	return {
		courses: courses.map(({ slug, title, summary, instructor, priceCents, currency }) => ({
			slug,
			title,
			summary,
			instructor,
			priceCents,
			currency
		}))
	};
};
