// The one access rule for lessons, quizzes and Assignments: open | sign-in | enrol | missing, for each kind of viewer.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { courses, enrolments } from '$lib/server/db/schema';
import { decideAccess, guardedAssignment, guardedLesson } from '$lib/server/lessons/access';
import { freshLearner, removeFreshPeople } from './support/people';

const COURSE = 'daylight-flash-for-action';
let learner: { id: string; roles: ['learner'] };
let courseId: number;

beforeAll(async () => {
	learner = { id: (await freshLearner()).id, roles: ['learner'] };
	courseId = (await db.query.courses.findFirst({ where: eq(courses.slug, COURSE) }))!.id;
});
afterAll(removeFreshPeople);

describe('decideAccess', () => {
	test('a free lesson is open to everyone; a paid one asks visitors to sign in and learners to enrol', async () => {
		const free = await guardedLesson(COURSE, 'guide-numbers');
		const paid = await guardedLesson(COURSE, 'inverse-square');
		expect(free).toMatchObject({ free: true, courseSlug: COURSE });
		expect(paid).toMatchObject({ free: false, courseSlug: COURSE });
		expect(await decideAccess(null, free)).toBe('open');
		expect(await decideAccess(null, paid)).toBe('sign-in');
		expect(await decideAccess(learner, paid)).toBe('enrol');
		expect(await decideAccess({ id: learner.id, roles: ['mentor'] }, paid)).toBe('open');
	});

	test('an unknown lesson is missing, whoever asks', async () => {
		const none = await guardedLesson(COURSE, 'no-such-lesson');
		expect(none).toBeNull();
		expect(await decideAccess(null, none)).toBe('missing');
		expect(await decideAccess(learner, none)).toBe('missing');
	});

	test('an active enrolment opens the paid lesson and every Assignment; a revoked one does not', async () => {
		const paid = await guardedLesson(COURSE, 'inverse-square');
		const assignment = guardedAssignment({ course: { id: courseId, slug: COURSE } });
		const [row] = await db.insert(enrolments).values({ userId: learner.id, courseId, source: 'admin' }).returning();
		try {
			expect(await decideAccess(learner, paid)).toBe('open');
			expect(await decideAccess(learner, assignment)).toBe('open');
			await db.update(enrolments).set({ status: 'revoked' }).where(eq(enrolments.id, row.id));
			expect(await decideAccess(learner, paid)).toBe('enrol');
		} finally {
			await db.delete(enrolments).where(eq(enrolments.id, row.id));
		}
	});

	test('Assignments are never free: a visitor signs in and a learner enrols even when the lesson is open', async () => {
		const assignment = guardedAssignment({ course: { id: courseId, slug: COURSE } });
		expect(await decideAccess(null, assignment)).toBe('sign-in');
		expect(await decideAccess(learner, assignment)).toBe('enrol');
		expect(await decideAccess(learner, guardedAssignment(null))).toBe('missing');
	});
});
