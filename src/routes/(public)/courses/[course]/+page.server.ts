import { error, fail, redirect } from '@sveltejs/kit';
import { readCoursePage } from '$lib/server/courses';
import { readEnrolmentState, readCourseNotice } from '$lib/server/payments/course-page';
import { startCheckout } from '$lib/server/payments/checkout';
import { requireUser } from '$lib/server/guards';
import { courseProgress } from '$lib/server/progress';
import { instructorForCourse } from '$lib/server/instructors';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, locals, url }) => {
	// the course, its outline and its guide in one query
	const found = await readCoursePage(params.course);
	if (!found) error(404, { message: 'There is no such course.' });
	const { course, modules, guide } = found;
	const [enrolment, progress] = await Promise.all([
		readEnrolmentState(locals.user, course.id),
		locals.user ? courseProgress(locals.user, course.id) : null
	]);
	return {
		course: {
			slug: course.slug,
			title: course.title,
			summary: course.summary,
			instructor: course.instructor,
			priceCents: course.priceCents,
			currency: course.currency
		},
		modules,
		instructorSlug: instructorForCourse(course.slug)?.slug ?? null,
		enrolment,
		notice: readCourseNotice(url.searchParams, modules),
		// a signed-in learner's completed lessons (by slug) and where they left off
		progress,
		guide,
		// the guide opens by itself until the visitor has opened a lesson of the course
		firstVisit: !progress?.started
	};
};

export const actions = {
	enrol: async (event) => {
		const user = requireUser(event);
		const data = await event.request.formData();
		const coupon = String(data.get('coupon') ?? '').slice(0, 100);
		const started = await startCheckout(user, event.params.course, coupon, event.url.origin, event.getClientAddress());
		if (started.kind === 'refused') return fail(started.status, { enrol: { message: started.message, coupon } });
		if (started.kind === 'enrolled') redirect(303, `/courses/${event.params.course}?checkout=${started.already ? 'already' : 'free'}`);
		// the provider's payment page, on another origin: the form is a plain POST, so the browser follows this 303
		redirect(303, started.url);
	}
} satisfies Actions;
