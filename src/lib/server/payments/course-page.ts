// What the course page says about enrolment: the visitor's state, and the message after checkout or a locked lesson.
import type { AuthUser } from '../auth';
import { db } from '../db';
import { isEnrolled } from './enrolments';

export type EnrolmentState = 'anonymous' | 'staff' | 'enrolled' | 'not-enrolled';
export type CourseNotice = { tone: 'ok' | 'error' | 'info'; text: string } | null;

export async function readEnrolmentState(user: Pick<AuthUser, 'id' | 'roles'> | null, courseId: number): Promise<EnrolmentState> {
	if (!user) return 'anonymous';
	if (await isEnrolled(db, user.id, courseId)) return 'enrolled';
	// staff open every lesson without enrolling (see hasCourseAccess)
	if (user.roles.some((r) => r === 'mentor' || r === 'author' || r === 'admin')) return 'staff';
	return 'not-enrolled';
}

const checkoutNotices: Record<string, NonNullable<CourseNotice>> = {
	cancelled: {
		tone: 'error',
		text: 'Checkout was cancelled: nothing was charged and you are not enrolled. If your card was declined, try another card or ask your bank, then enrol again.'
	},
	already: { tone: 'ok', text: 'You are already enrolled in this course.' },
	free: { tone: 'ok', text: 'You are enrolled. Every lesson is open to you.' }
};

/** ?checkout=… after the payment page, or ?locked=<lesson> when a members-only lesson sent the visitor here. */
export function readCourseNotice(params: URLSearchParams, modules: { lessons: { slug: string; title: string }[] }[]): CourseNotice {
	const checkout = checkoutNotices[params.get('checkout') ?? ''];
	if (checkout) return checkout;
	const locked = params.get('locked');
	const lesson = locked ? modules.flatMap((m) => m.lessons).find((l) => l.slug === locked) : undefined;
	if (lesson) return { tone: 'info', text: `“${lesson.title}” opens once you are enrolled in this course.` };
	return null;
}
