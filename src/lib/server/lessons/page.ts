// The lesson page in one call: the lesson, its Assignments, clips and neighbours in one query (page-query.ts), the
// access rule, then the kept render, the viewer's progress and the Assignment cards, read side by side.
import { error } from '@sveltejs/kit';
import { getLesson } from '../courses';
import { lessonAssignmentCards } from '../attempts/history';
import { setLessonComplete, visitLesson } from '../progress';
import type { AuthUser } from '../auth';
import type { LessonPageData } from '../../lessons/page-data';
import { actionAccess, decideAccess, lessonPageAccess, type Guarded } from './access';
import { readLessonPageRows } from './page-query';
import { clipCard } from '../clips/view';
import { renderPublishedLesson } from './published';

/** A found lesson, as far as the access rule reads it. */
type Found = { course: { id: number; slug: string }; lesson: { freePreview: boolean } };

/** What the access rule needs of a found lesson. */
export function guardOf(found: Found | null): Guarded {
	return found ? { courseId: found.course.id, courseSlug: found.course.slug, free: found.lesson.freePreview } : null;
}

/** The page's data; a visitor or learner without access is redirected (sign-in, enrol offer), a missing lesson is a 404. */
export async function loadLessonPage(user: AuthUser | null, url: URL, courseSlug: string, lessonSlug: string): Promise<LessonPageData> {
	const found = await readLessonPageRows(courseSlug, lessonSlug);
	// paid access, checked before the lesson's text is read: others get the course page's enrol offer
	lessonPageAccess(await decideAccess(user, guardOf(found)), { url, courseSlug, lessonSlug });
	const { lesson, module, course, neighbours } = found!;
	// every lesson is rendered on the server, files too: a client-side import would put paid text in public bundles
	const [rendered, visit, assignments] = await Promise.all([
		renderPublishedLesson(lesson),
		user ? visitLesson(user.id, lesson.id) : null,
		lessonAssignmentCards(user, { courseId: course.id, courseSlug: course.slug, lessonSlug: lesson.slug }, found!.assignments)
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
		clips: found!.clips.map(clipCard),
		neighbours
	};
}

/** "I've finished this lesson" (done) or its undo, for a signed-in person the rule lets in. */
export async function markLessonDone(user: AuthUser, url: URL, courseSlug: string, lessonSlug: string, done: boolean): Promise<void> {
	const found = await getLesson(courseSlug, lessonSlug);
	actionAccess(await decideAccess(user, guardOf(found)), { url, courseSlug });
	await setLessonComplete(user.id, found!.lesson.id, done);
}
