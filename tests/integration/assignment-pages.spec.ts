// The learner's pages around attempts: Assignment card data on the lesson page, the upload page, the verdict page and progress.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { assignments, courses } from '$lib/server/db/schema';
import { closeQueue, GRADE_QUEUE, openQueue } from '$lib/server/attempts/queue';
import { gradeAttempt } from '$lib/server/attempts/grade-job';
import { lessonAssignmentCards } from '$lib/server/attempts/history';
import { submitAttempt } from '$lib/server/attempts/submit';
import { readUploadForm } from '$lib/server/attempts/upload-form';
import { load as lessonLoad } from '../../src/routes/(learn)/courses/[course]/[lesson]/+page.server';
import { load as uploadLoad } from '../../src/routes/(learn)/courses/[course]/[lesson]/assignments/[slug]/+page.server';
import { load as verdictLoad } from '../../src/routes/(learn)/attempts/[id]/+page.server';
import { load as progressLoad } from '../../src/routes/(learn)/progress/+page.server';
import { makeEvent, throughHooks } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { ASSIGNMENT, attemptIdsOf, COURSE, enrol, key, LESSON, passingPair, removeAttempts, uploadData } from './support/attempts';

type Learner = Awaited<ReturnType<typeof freshLearner>>;
let enrolled: Learner;
let outsider: Learner;

async function visit<T>(load: (e: never) => T, email: string | null, path: string, params: Record<string, string>) {
	const cookies = email ? await signedInCookies(email) : undefined;
	return throughHooks(makeEvent({ path, cookies, params }), (e) => load(e as never));
}

const uploadPath = `/courses/${COURSE}/${LESSON}/assignments/${ASSIGNMENT}`;
const uploadParams = { course: COURSE, lesson: LESSON, slug: ASSIGNMENT };

beforeAll(async () => {
	await openQueue();
	enrolled = await freshLearner();
	outsider = await freshLearner();
	await enrol(enrolled.id);
});

afterAll(async () => {
	await removeAttempts([...(await attemptIdsOf(enrolled.id)), ...(await attemptIdsOf(outsider.id))]);
	await removeFreshPeople();
	await closeQueue();
});

describe('Assignment card data', () => {
	test('the lesson page returns each assignment with plain-word criteria and an upload link for an enrolled learner', async () => {
		const outcome = await visit(lessonLoad, enrolled.email, `/courses/${COURSE}/${LESSON}`, { course: COURSE, lesson: LESSON });
		expect(outcome.kind).toBe('value');
		const data = (outcome as unknown as { value: { assignments: unknown[] } }).value;
		expect(data.assignments).toEqual([
			{
				slug: 'off-the-axis',
				title: 'Off the axis',
				brief: expect.stringContaining('at least 45 degrees'),
				frames: ['reference', 'lit'],
				criteria: [
					expect.stringMatching(/^Set the ambient exposure 1½ ± ½ stops under your ambient reference frame/),
					expect.stringContaining('Light the subject so the flash lifts them at least 1 stop above the ambient alone'),
					expect.stringContaining('The background must darken between the reference and the lit frame'),
					expect.stringContaining('Light the subject with flash')
				],
				lastVerdict: null,
				uploadHref: uploadPath
			}
		]);
	});

	test('without access (signed out, or not enrolled) there is no upload link; staff always have one', async () => {
		const course = (await db.query.courses.findFirst({ where: eq(courses.slug, COURSE) }))!;
		const list = await db.select().from(assignments).where(eq(assignments.slug, ASSIGNMENT));
		const place = { courseId: course.id, courseSlug: COURSE, lessonSlug: LESSON };
		expect((await lessonAssignmentCards(null, place, list))[0].uploadHref).toBeNull();
		expect((await lessonAssignmentCards({ id: outsider.id, roles: ['learner'] }, place, list))[0].uploadHref).toBeNull();
		expect((await lessonAssignmentCards({ id: 'x', roles: ['learner', 'mentor'] }, place, list))[0].uploadHref).toBe(uploadPath);
		expect(await lessonAssignmentCards(null, place, [])).toEqual([]);
	});

	test('after a graded attempt the card shows its verdict and date', async () => {
		const form = readUploadForm(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, await passingPair()));
		if (!form.ok) throw new Error(form.message);
		const made = await submitAttempt({ id: enrolled.id, roles: ['learner'] }, form.form);
		if (made.kind !== 'created') throw new Error(made.kind);
		await (await openQueue()).deleteJob(GRADE_QUEUE, made.id);
		await gradeAttempt(made.id);
		const course = (await db.query.courses.findFirst({ where: eq(courses.slug, COURSE) }))!;
		const list = await db.select().from(assignments).where(eq(assignments.slug, ASSIGNMENT));
		const [card] = await lessonAssignmentCards({ id: enrolled.id, roles: ['learner'] }, { courseId: course.id, courseSlug: COURSE, lessonSlug: LESSON }, list);
		expect(card.lastVerdict).toEqual({ verdict: 'pass', at: expect.stringMatching(/^\d{4}-\d{2}-\d{2}T/) });
	});
});

describe('learner pages', () => {
	test('the upload page: enrolled learners get the frames, criteria, limit and history; others a 403; a wrong lesson a 404', async () => {
		const ok = await visit(uploadLoad, enrolled.email, uploadPath, uploadParams);
		expect(ok.kind).toBe('value');
		const data = (ok as { value: Record<string, unknown> }).value as { assignment: { frames: string[]; open: boolean }; history: unknown[]; maxUploadBytes: number };
		expect(data.assignment).toMatchObject({ frames: ['reference', 'lit'], open: true });
		expect(data.history).toHaveLength(1);
		expect(data.maxUploadBytes).toBe(40 * 1024 * 1024);
		expect(await visit(uploadLoad, outsider.email, uploadPath, uploadParams)).toMatchObject({ kind: 'error', status: 403 });
		expect(await visit(uploadLoad, null, uploadPath, uploadParams)).toMatchObject({ kind: 'redirect', status: 303 });
		expect(await visit(uploadLoad, enrolled.email, uploadPath, { ...uploadParams, lesson: 'what-a-stop-is' })).toMatchObject({ kind: 'error', status: 404 });
	});

	test('the verdict page opens for the owner and mentors; another learner gets the same 404 as a missing attempt', async () => {
		const [id] = await attemptIdsOf(enrolled.id);
		const path = `/attempts/${id}`;
		const own = await visit(verdictLoad, enrolled.email, path, { id });
		expect(own).toMatchObject({ kind: 'value', value: { attempt: { id, status: 'graded', verdict: 'pass', mine: true } } });
		const frames = (own as unknown as { value: { attempt: { frames: { name: string; large: string; exif: unknown[] }[] } } }).value.attempt.frames;
		expect(frames.map((f) => f.name)).toEqual(['reference', 'lit']);
		expect(frames[1].large).toBe(`/files/attempts/${id}/lit/large`);
		expect(frames[1].exif).toContainEqual({ label: 'Shutter', value: '1/1500 s' });
		expect((await visit(verdictLoad, demoAccount('mentor').email, path, { id })).kind).toBe('value');
		expect(await visit(verdictLoad, outsider.email, path, { id })).toMatchObject({ kind: 'error', status: 404 });
		expect(await visit(verdictLoad, outsider.email, '/attempts/nope', { id: 'nope' })).toMatchObject({ kind: 'error', status: 404 });
	});

	test('progress lists graded attempts with how far they missed', async () => {
		const outcome = await visit(progressLoad, enrolled.email, '/progress', {});
		const points = (outcome as unknown as { value: { points: { ambientMiss: number | null; flashMiss: number | null; met: number; total: number }[] } }).value.points;
		expect(points).toHaveLength(1);
		expect(points[0]).toMatchObject({ ambientMiss: 0, flashMiss: 0, met: 4, total: 4 });
		const empty = await visit(progressLoad, outsider.email, '/progress', {});
		expect(empty).toMatchObject({ kind: 'value', value: { points: [] } });
	});
});
