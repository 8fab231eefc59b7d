// A mentor reviews an Attempt: numbered pins as fractions of the frame, rubric and critique, an audited override, the learner's e-mail.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { attempts, pins, verdictOverrides } from '$lib/server/db/schema';
import { closeQueue, GRADE_QUEUE, openQueue } from '$lib/server/attempts/queue';
import { gradeAttempt } from '$lib/server/attempts/grade-job';
import { submitAttempt } from '$lib/server/attempts/submit';
import { readUploadForm } from '$lib/server/attempts/upload-form';
import { loadAttemptView } from '$lib/server/attempts/view';
import { addPin } from '$lib/server/review/save';
import { actions, load } from '../../src/routes/(mentor)/mentor/attempts/[id]/+page.server';
import { failureOf, makeEvent, throughHooks } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies, userIdOf } from './support/people';
import { waitForMail } from './support/mail';
import { ASSIGNMENT, attemptIdsOf, enrol, key, passingPair, removeAttempts, uploadData } from './support/attempts';

let learner: Awaited<ReturnType<typeof freshLearner>>;
let attemptId: string;
let mentor: { id: string; email: string };

async function act(name: keyof typeof actions, form: Record<string, string>, who: 'mentor' | 'learner' = 'mentor') {
	const cookies = await signedInCookies(who === 'mentor' ? mentor.email : learner.email);
	const event = makeEvent({ path: `/mentor/attempts/${attemptId}?/${name}`, form, cookies, params: { id: attemptId } });
	return throughHooks(event, (e) => (actions[name] as (e: never) => unknown)(e as never));
}

beforeAll(async () => {
	await openQueue();
	mentor = { id: await userIdOf(demoAccount('mentor').email), email: demoAccount('mentor').email };
	learner = await freshLearner();
	await enrol(learner.id);
	const form = readUploadForm(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, await passingPair()));
	if (!form.ok) throw new Error(form.message);
	const made = await submitAttempt({ id: learner.id, roles: ['learner'] }, form.form);
	if (made.kind !== 'created') throw new Error(made.kind);
	attemptId = made.id;
	await (await openQueue()).deleteJob(GRADE_QUEUE, attemptId);
	expect(await gradeAttempt(attemptId)).toBe('graded');
});

afterAll(async () => {
	await removeAttempts(await attemptIdsOf(learner.id));
	await removeFreshPeople();
	await closeQueue();
});

describe('mentor review', () => {
	test('pins are numbered in order, stored as fractions, and checked', async () => {
		const first = await act('pin', { frame: 'lit', x: '0.25', y: '0.5', text: 'Key light lands here, behind the shoulder' });
		expect(first).toMatchObject({ kind: 'value', value: { pin: { ok: true, message: 'Pin 1 added.' } } });
		// two at once still get distinct numbers
		const both = await Promise.all([
			addPin(mentor, attemptId, { frameName: 'reference', x: 0.1, y: 0.1, text: 'Sky is metered well' }),
			addPin(mentor, attemptId, { frameName: 'lit', x: 0.9, y: 0.9, text: 'Watch the bright edge' })
		]);
		expect(both.map((b) => b.ok && b.number).sort()).toEqual([2, 3]);
		const rows = await db.select().from(pins).where(eq(pins.attemptId, attemptId));
		expect(rows.find((p) => p.number === 1)).toMatchObject({ frameName: 'lit', x: 0.25, y: 0.5, mentorId: mentor.id });

		const outside = await act('pin', { frame: 'lit', x: '1.2', y: '0.5', text: 'x' });
		expect(failureOf((outside as { value: unknown }).value)).toEqual({ status: 400, data: { pin: { message: 'Place the pin on the photo.' } } });
		const noFrame = await act('pin', { frame: 'sideways', x: '0.5', y: '0.5', text: 'x' });
		expect(failureOf((noFrame as { value: unknown }).value)?.data).toEqual({ pin: { message: 'That frame is not part of this attempt.' } });
		const empty = await act('pin', { frame: 'lit', x: '0.5', y: '0.5', text: '  ' });
		expect(failureOf((empty as { value: unknown }).value)?.status).toBe(400);

		const third = rows.find((p) => p.number === 3)!;
		expect(await act('unpin', { pin: String(third.id) })).toMatchObject({ kind: 'value', value: { pin: { ok: true } } });
	});

	test('the learner sees no pins or critique before the review is sent', async () => {
		const view = await loadAttemptView({ id: learner.id, roles: ['learner'] }, attemptId);
		expect(view).toMatchObject({ mine: true, critique: null, pins: [], overrides: [], reviewState: 'open' });
		expect(view?.criteria.map((c) => c.verdict)).toEqual(['pass', 'pass', 'pass', 'pass']);
	});

	test('learners and authors cannot use the mentor page or its actions', async () => {
		expect(await act('pin', { frame: 'lit', x: '0.5', y: '0.5', text: 'mine now' }, 'learner')).toMatchObject({ kind: 'error', status: 403 });
		const cookies = await signedInCookies(demoAccount('author').email);
		const page = await throughHooks(makeEvent({ path: `/mentor/attempts/${attemptId}`, cookies, params: { id: attemptId } }), (e) => load(e as never));
		expect(page).toMatchObject({ kind: 'error', status: 403 });
	});

	test('changing the verdict needs a reason; with one it is audited and the learner is e-mailed', async () => {
		const noReason = await act('review', { text: 'Good ambient control.', verdict: 'fail', reason: '' });
		expect(failureOf((noReason as { value: unknown }).value)?.data).toEqual({
			review: { message: 'Say why you change the verdict: the learner reads it, and it is kept on record.' }
		});
		expect((await db.query.attempts.findFirst({ where: eq(attempts.id, attemptId) }))?.reviewState).toBe('open');

		const sent = await act('review', {
			text: 'Good ambient control. The flash is too close to the camera axis for this assignment.',
			verdict: 'fail',
			reason: 'The light sits about 20 degrees off the axis; the assignment asks for 45 or more.',
			'rubric:ambient': '4',
			'rubric:light': '2',
			'rubric:bogus': '9'
		});
		expect(sent).toMatchObject({ kind: 'value', value: { review: { ok: true } } });
		const row = await db.query.attempts.findFirst({ where: eq(attempts.id, attemptId) });
		expect(row).toMatchObject({ verdict: 'fail', autoVerdict: 'pass', reviewState: 'reviewed' });
		expect(row?.reviewedAt).toBeInstanceOf(Date);
		const audit = await db.select().from(verdictOverrides).where(eq(verdictOverrides.attemptId, attemptId));
		expect(audit).toEqual([
			expect.objectContaining({ mentorId: mentor.id, mentorEmail: mentor.email, verdictBefore: 'pass', verdictAfter: 'fail', reason: expect.stringContaining('45 or more') })
		]);

		const mail = await waitForMail(learner.email, /Your mentor's critique: Off the axis/);
		expect(mail.text).toContain('The mentor changed the verdict to: not yet.');
		expect(mail.text).toMatch(new RegExp(`https?://[^\\s]+/attempts/${attemptId}`));
	});

	test('the learner now reads the critique, rubric, pins and why the verdict changed', async () => {
		const view = await loadAttemptView({ id: learner.id, roles: ['learner'] }, attemptId);
		expect(view?.critique).toMatchObject({ text: expect.stringContaining('too close to the camera axis'), rubric: { ambient: 4, light: 2 }, mentor: 'Tess Lindqvist (demo)' });
		expect(view?.pins.map((p) => p.number)).toEqual([1, 2]);
		expect(view?.overrides).toEqual([expect.objectContaining({ before: 'pass', after: 'fail', mentor: 'your mentor' })]);
		expect(view?.verdict).toBe('fail');
	});

	test('keeping the verdict on a later edit adds no audit row', async () => {
		await act('review', { text: 'Updated: also watch the horizon.', verdict: 'keep', reason: '' });
		const audit = await db.select().from(verdictOverrides).where(eq(verdictOverrides.attemptId, attemptId));
		expect(audit).toHaveLength(1);
		expect((await db.query.attempts.findFirst({ where: eq(attempts.id, attemptId) }))?.verdict).toBe('fail');
	});
});
