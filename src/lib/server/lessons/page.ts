// The lesson page in one call: the access rule, then the kept render, the viewer's progress, the Assignment cards
// and the neighbours, read side by side.
import { error } from '@sveltejs/kit';
import { getLesson, lessonAssignments } from '../courses';
import { lessonAssignmentCards } from '../attempts/history';
import { lessonNeighbours } from '../lesson-neighbours';
import { setLessonComplete, visitLesson } from '../progress';
import type { AuthUser } from '../auth';
import type { LessonPageData } from '../../lessons/page-data';
import { actionAccess, decideAccess, lessonPageAccess, type Guarded } from './access';
import { renderPublishedLesson } from './published';

type Found = NonNullable<Awaited<ReturnType<typeof getLesson>>>;

/** What the access rule needs of a found lesson. */
export function guardOf(found: Found | null): Guarded {
	return found ? { courseId: found.course.id, courseSlug: found.course.slug, free: found.lesson.freePreview } : null;
}

/** The page's data; a visitor or learner without access is redirected (sign-in, enrol offer), a missing lesson is a 404. */
export async function loadLessonPage(user: AuthUser | null, url: URL, courseSlug: string, lessonSlug: string): Promise<LessonPageData> {
	const found = await getLesson(courseSlug, lessonSlug);
	// paid access, checked before anything of the lesson is read: others get the course page's enrol offer
	lessonPageAccess(await decideAccess(user, guardOf(found)), { url, courseSlug, lessonSlug });
	const { lesson, module, course } = found!;
	// every lesson is rendered on the server, files too: a client-side import would put paid text in public bundles
	const [rendered, visit, assignments, neighbours] = await Promise.all([
		renderPublishedLesson(lesson),
		user ? visitLesson(user.id, lesson.id) : null,
		lessonAssignments(lesson.id).then((list) =>
			lessonAssignmentCards(user, { courseId: course.id, courseSlug: course.slug, lessonSlug: lesson.slug }, list)
		),
		lessonNeighbours(course.id, lesson.id)
	]);
	if (!rendered) error(404, { message: 'This lesson has no text yet.' });
	return {
		course: { slug: course.slug, title: course.title },
		module: { slug: module.slug, title: module.title },
		lesson: { slug: lesson.slug, title: lesson.title, summary: lesson.summary, minutes: lesson.minutes, freePreview: lesson.freePreview },
		segments: rendered.segments,
		progress: visit ? { completed: visit.completed } : null,
		quizAnswers: visit?.quizAnswers ?? {},
		assignments,
		neighbours
	};
}

/** "I've finished this lesson" (done) or its undo, for a signed-in person the rule lets in. */
export async function markLessonDone(user: AuthUser, url: URL, courseSlug: string, lessonSlug: string, done: boolean): Promise<void> {
	const found = await getLesson(courseSlug, lessonSlug);
	actionAccess(await decideAccess(user, guardOf(found)), { url, courseSlug });
	await setLessonComplete(user.id, found!.lesson.id, done);
}
