// A mentor reviews an Attempt: numbered pins as fractions of the frame, rubric and critique, an audited override, the learner's e-mail.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { randomUUID } from 'node:crypto';
import { stringify } from 'devalue';
import { db } from '$lib/server/db';
import { attempts, auditLog, pins, verdictOverrides } from '$lib/server/db/schema';
import { closeQueue, openQueue } from '$lib/server/attempts/queue';
import { loadAttemptView } from '$lib/server/attempts/view';
import { addPin } from '$lib/server/review/save';
import { actions, load } from '../../src/routes/(mentor)/mentor/attempts/[id]/+page.server';
import { failureOf, makeEvent, throughHooks } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies, userIdOf } from './support/people';
import { waitForMail } from './support/mail';
import { attemptIdsOf, enrol, gradedAttemptOf, removeAttempts } from './support/attempts';

let learner: Awaited<ReturnType<typeof freshLearner>>;
let attemptId: string;
let mentor: { id: string; email: string };

async function act(name: keyof typeof actions, form: Record<string, string>, who: 'mentor' | 'learner' = 'mentor') {
	const cookies = await signedInCookies(who === 'mentor' ? mentor.email : learner.email);
	const event = makeEvent({ path: `/mentor/attempts/${attemptId}?/${name}`, form, cookies, params: { id: attemptId } });
	return throughHooks(event, (e) => (actions[name] as (e: never) => unknown)(e as never));
}

/** The review form posts its data as superforms' JSON (the rubric is a record). */
function reviewPost(data: { text: string; verdict: string; reason: string; rubric?: Record<string, number> }) {
	return { __superform_id: 'review', __superform_json: stringify({ rubric: {}, ...data }) };
}

type FormResult = { form: { valid: boolean; data: Record<string, unknown>; errors: Record<string, string[] | undefined>; message?: { text: string; ok: boolean } } };
/** The superform an action answered with, whether it succeeded or failed. */
function formOf(outcome: unknown): FormResult['form'] {
	const value = (outcome as { value: unknown }).value;
	const failed = failureOf(value);
	return ((failed ? failed.data : value) as FormResult).form;
}
const pinPost = (fields: Record<string, string>) => ({ __superform_id: 'pin-lit', frame: 'lit', key: randomUUID(), ...fields });

beforeAll(async () => {
	await openQueue();
	mentor = { id: await userIdOf(demoAccount('mentor').email), email: demoAccount('mentor').email };
	learner = await freshLearner();
	await enrol(learner.id);
	attemptId = await gradedAttemptOf(learner.id);
});

afterAll(async () => {
	await removeAttempts(await attemptIdsOf(learner.id));
	await removeFreshPeople();
	await closeQueue();
});

describe('mentor review', () => {
	test('pins are numbered in order, stored as fractions, and checked', async () => {
		const first = await act('pin', pinPost({ across: '25', down: '50', text: 'Key light lands here, behind the shoulder' }));
		expect(formOf(first).message).toEqual({ text: 'Pin 1 added.', ok: true });
		// the answer is an empty form with a new key, ready for the next pin
		expect(formOf(first).data).toMatchObject({ frame: 'lit', text: '', across: 50, down: 50 });
		// two at once still get distinct numbers
		const both = await Promise.all([
			addPin(mentor, attemptId, { frameName: 'reference', x: 0.1, y: 0.1, text: 'Sky is metered well', clientKey: randomUUID() }),
			addPin(mentor, attemptId, { frameName: 'lit', x: 0.9, y: 0.9, text: 'Watch the bright edge', clientKey: randomUUID() })
		]);
		expect(both.map((b) => b.ok && b.number).sort()).toEqual([2, 3]);
		const rows = await db.select().from(pins).where(eq(pins.attemptId, attemptId));
		expect(rows.find((p) => p.number === 1)).toMatchObject({ frameName: 'lit', x: 0.25, y: 0.5, mentorId: mentor.id });

		const outside = await act('pin', pinPost({ across: '120', down: '50', text: 'x' }));
		expect(failureOf((outside as { value: unknown }).value)?.status).toBe(400);
		expect(formOf(outside).errors.across).toEqual(['Place the pin on the photo.']);
		const noFrame = await act('pin', { ...pinPost({ across: '50', down: '50', text: 'x' }), frame: 'sideways' });
		expect(formOf(noFrame).message).toEqual({ text: 'That frame is not part of this attempt.', ok: false });
		const empty = await act('pin', pinPost({ across: '50', down: '50', text: '  ' }));
		expect(formOf(empty).errors.text).toEqual(['Write what the pin should say.']);

		const third = rows.find((p) => p.number === 3)!;
		const removed = await act('unpin', { __superform_id: 'unpin-lit', pin: String(third.id) });
		expect(formOf(removed).message).toEqual({ text: 'Pin removed.', ok: true });
		const again = await act('unpin', { __superform_id: 'unpin-lit', pin: String(third.id) });
		expect(formOf(again).message).toEqual({ text: 'That pin is already gone.', ok: false });
	});

	test('a double-clicked "Pin it" (the same key twice, even at once) makes one pin', async () => {
		const key = randomUUID();
		const post = { ...pinPost({ across: '40', down: '60', text: 'Rim light clips here' }), key };
		const [a, b] = await Promise.all([act('pin', post), act('pin', post)]);
		// pins 1 and 2 remain, so this is pin 3, and both answers name the same one
		expect([formOf(a).message?.text, formOf(b).message?.text]).toEqual(['Pin 3 added.', 'Pin 3 added.']);
		const withKey = await db.select().from(pins).where(and(eq(pins.attemptId, attemptId), eq(pins.clientKey, key)));
		expect(withKey).toHaveLength(1);
		const late = await act('pin', post);
		expect(formOf(late).message?.text).toBe('Pin 3 added.');
		expect(await db.select().from(pins).where(eq(pins.attemptId, attemptId))).toHaveLength(3);
		await db.delete(pins).where(eq(pins.clientKey, key));
	});

	test('the learner sees no pins or critique before the review is sent', async () => {
		const view = await loadAttemptView({ id: learner.id, roles: ['learner'] }, attemptId);
		expect(view).toMatchObject({ mine: true, critique: null, pins: [], overrides: [], reviewState: 'open' });
		expect(view?.criteria.map((c) => c.verdict)).toEqual(['pass', 'pass', 'pass', 'pass']);
	});

	test('learners and authors cannot use the mentor page or its actions', async () => {
		expect(await act('pin', pinPost({ across: '50', down: '50', text: 'mine now' }), 'learner')).toMatchObject({ kind: 'error', status: 403 });
		const cookies = await signedInCookies(demoAccount('author').email);
		const page = await throughHooks(makeEvent({ path: `/mentor/attempts/${attemptId}`, cookies, params: { id: attemptId } }), (e) => load(e as never));
		expect(page).toMatchObject({ kind: 'error', status: 403 });
	});

	test('changing the verdict needs a reason; with one it is audited and the learner is e-mailed', async () => {
		const noReason = await act('review', reviewPost({ text: 'Good ambient control.', verdict: 'fail', reason: '' }));
		expect(formOf(noReason).errors.reason).toEqual(['Say why you change the verdict: the learner reads it, and it is kept on record.']);
		expect((await db.query.attempts.findFirst({ where: eq(attempts.id, attemptId) }))?.reviewState).toBe('open');

		const sent = await act(
			'review',
			reviewPost({
				text: 'Good ambient control. The flash is too close to the camera axis for this assignment.',
				verdict: 'fail',
				reason: 'The light sits about 20 degrees off the axis; the assignment asks for 45 or more.',
				// colour is not on this assignment's rubric (no colour criterion): it is dropped
				rubric: { ambient: 4, light: 2, colour: 3 }
			})
		);
		expect(formOf(sent).message).toMatchObject({ ok: true, text: expect.stringContaining('Review sent.') });
		const row = await db.query.attempts.findFirst({ where: eq(attempts.id, attemptId) });
		expect(row).toMatchObject({ verdict: 'fail', autoVerdict: 'pass', reviewState: 'reviewed' });
		expect(row?.reviewedAt).toBeInstanceOf(Date);
		const audit = await db.select().from(verdictOverrides).where(eq(verdictOverrides.attemptId, attemptId));
		expect(audit).toEqual([
			expect.objectContaining({ mentorId: mentor.id, mentorEmail: mentor.email, verdictBefore: 'pass', verdictAfter: 'fail', reason: expect.stringContaining('45 or more') })
		]);
		const logged = await db.select().from(auditLog).where(eq(auditLog.href, `/mentor/attempts/${attemptId}`));
		expect(logged).toEqual([
			expect.objectContaining({ action: 'verdict.override', actorEmail: mentor.email, detail: 'pass → fail', subject: `${learner.email}: Off the axis`, reason: expect.stringContaining('45 or more') })
		]);

		const mail = await waitForMail(learner.email, /Your mentor's critique: Off the axis/);
		expect(mail.text).toContain('The mentor changed the verdict to: not yet.');
		expect(mail.text).toMatch(new RegExp(`https?://[^\\s]+/attempts/${attemptId}`));
	});

	test('the learner now reads the critique, rubric, pins and why the verdict changed', async () => {
		const view = await loadAttemptView({ id: learner.id, roles: ['learner'] }, attemptId);
		expect(view?.critique).toMatchObject({ text: expect.stringContaining('too close to the camera axis'), rubric: { ambient: 4, light: 2 }, mentor: 'Tess Lindqvist (demo)' });
		expect(view?.rubric.map((r) => r.id)).not.toContain('colour');
		expect(view?.pins.map((p) => p.number)).toEqual([1, 2]);
		expect(view?.overrides).toEqual([expect.objectContaining({ before: 'pass', after: 'fail', mentor: 'your mentor' })]);
		expect(view?.verdict).toBe('fail');
	});

	test('keeping the verdict on a later edit adds no audit row', async () => {
		const kept = await act('review', reviewPost({ text: 'Updated: also watch the horizon.', verdict: 'keep', reason: '' }));
		expect(formOf(kept).message?.text).toContain('Review updated.');
		const audit = await db.select().from(verdictOverrides).where(eq(verdictOverrides.attemptId, attemptId));
		expect(audit).toHaveLength(1);
		expect((await db.query.attempts.findFirst({ where: eq(attempts.id, attemptId) }))?.verdict).toBe('fail');
	});
});
