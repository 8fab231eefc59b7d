import { error } from '@sveltejs/kit';
import { getLesson } from '$lib/server/courses';
import { renderPublishedLesson } from '$lib/server/lessons/published';
import { setLessonComplete, visitLesson } from '$lib/server/progress';
import { actionAccess, decideAccess, lessonPageAccess } from '$lib/server/lessons/access';
import { requireUser } from '$lib/server/guards';
import { lessonAssignmentCards } from '$lib/server/attempts/history';
import { lessonNeighbours } from '$lib/server/lesson-neighbours';
import type { LessonPageData } from '$lib/lessons/page-data';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, locals, url }) => {
	const found = await getLesson(params.course, params.lesson);
	// paid access, checked before anything of the lesson is returned: others get the course page's enrol offer
	lessonPageAccess(await decideAccess(locals.user, guardOf(found)), { url, courseSlug: params.course, lessonSlug: params.lesson });
	const { lesson, module, course } = found!;
	// every lesson is rendered here, files too: a client-side import would put paid text in public bundles
	const [rendered, visit, assignmentCards, neighbours] = await Promise.all([
		renderPublishedLesson(lesson),
		locals.user ? visitLesson(locals.user.id, lesson.id) : null,
		lessonAssignmentCards(locals.user, { courseId: course.id, courseSlug: course.slug, lessonSlug: lesson.slug }, found!.assignments),
		lessonNeighbours(course.id, lesson.id)
	]);
	if (!rendered) error(404, { message: 'This lesson has no text yet.' });
	return {
		course: { slug: course.slug, title: course.title },
		module: { slug: module.slug, title: module.title },
		lesson: {
			slug: lesson.slug,
			title: lesson.title,
			summary: lesson.summary,
			minutes: lesson.minutes,
			freePreview: lesson.freePreview
		},
		segments: rendered.segments,
		progress: visit ? { completed: visit.completed } : null,
		quizAnswers: visit?.quizAnswers ?? {},
		assignments: assignmentCards,
		neighbours
	} satisfies LessonPageData;
};

function guardOf(found: Awaited<ReturnType<typeof getLesson>>) {
	return found ? { courseId: found.course.id, courseSlug: found.course.slug, free: found.lesson.freePreview } : null;
}

export const actions = {
	/** "I've finished this lesson" (done=yes) and its undo (done=no). */
	complete: async (event) => {
		const user = requireUser(event);
		const found = await getLesson(event.params.course, event.params.lesson);
		actionAccess(await decideAccess(user, guardOf(found)), { url: event.url, courseSlug: event.params.course });
		const done = (await event.request.formData()).get('done') !== 'no';
		await setLessonComplete(user.id, found!.lesson.id, done);
		return { completed: done };
	}
} satisfies Actions;
