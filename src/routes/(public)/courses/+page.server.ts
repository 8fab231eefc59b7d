import { listCourses } from '$lib/server/courses';
import { resumePoints, type ResumePoint } from '$lib/server/progress';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	const [courses, resume] = await Promise.all([listCourses(), locals.user ? resumePoints(locals.user) : ({} as Record<string, ResumePoint>)]);
	return {
		// per course slug: the lesson the signed-in learner opened last
		resume,
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
