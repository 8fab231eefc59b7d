// Shoot Plans on the real database: a learner files one, uploads stay closed until a mentor approves it, a plan sent back is revised.
import { and, eq, like } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { db } from '$lib/server/db';
import { auditLog, shootPlans, users } from '$lib/server/db/schema';
import { findAssignment } from '$lib/server/attempts/assignment';
import { closeQueue, openQueue } from '$lib/server/attempts/queue';
import { POST as upload } from '../../src/routes/api/v1/attempts/+server';
import * as assignmentPage from '../../src/routes/(learn)/courses/[course]/[lesson]/assignments/[slug]/+page.server';
import * as planPage from '../../src/routes/(mentor)/mentor/plans/[id=integer]/+page.server';
import * as plansPage from '../../src/routes/(mentor)/mentor/plans/+page.server';
import { failureOf, makeEvent, throughHooks, type TestCookies } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { attemptIdsOf, enrol, key, multipartEvent, passingPair, removeAttempts, uploadData } from './support/attempts';
import { waitForMail } from './support/mail';

const SLUG = 'rembrandt-in-motion';
type Learner = Awaited<ReturnType<typeof freshLearner>>;
type Form = { valid: boolean; errors: Record<string, unknown>; message?: { text: string; ok: boolean } };

let learner: Learner;
let learnerCookies: TestCookies;
let mentorCookies: TestCookies;
let params: Record<string, string>;
let assignmentId: number;
let pair: { reference: Buffer; lit: Buffer };

const lightPlan = JSON.stringify({ camera: { x: 0, y: -3 }, subject: { x: 0, y: 0 }, lights: [{ x: -2, y: 1.5 }] });
const goodPlan = (over: Record<string, string | string[]> = {}) => ({
	lightPlan,
	shutter: '1/250',
	aperture: 'f/8',
	iso: '200',
	flash: '1/2 power at 2.5 m, bare',
	story: 'The climber reaches from the second hold; the stand is left of the wall, outside the mats, held by Ana.',
	checked: ['0', '1', '2', '3', '4'],
	...over
});

const formOf = (outcome: unknown): Form => {
	const value = (outcome as { value: unknown }).value;
	return ((failureOf(value)?.data ?? value) as { form: Form }).form;
};
const statusOf = (outcome: unknown) => failureOf((outcome as { value: unknown }).value)?.status ?? 200;

function filePlan(form: Record<string, string | string[]>, cookies = learnerCookies) {
	const event = makeEvent({ path: `/courses/${params.course}/${params.lesson}/assignments/${SLUG}?/filePlan`, form, cookies, params });
	return throughHooks(event, (e) => assignmentPage.actions.filePlan(e as never));
}
function decide(planId: number, form: Record<string, string>, cookies = mentorCookies) {
	const event = makeEvent({ path: `/mentor/plans/${planId}?/decide`, form, cookies, params: { id: String(planId) } });
	return throughHooks(event, (e) => planPage.actions.decide(e as never));
}
async function send(cookies = learnerCookies) {
	const outcome = await throughHooks(multipartEvent('/api/v1/attempts', uploadData({ assignment: SLUG, submissionKey: key(), lightPlan }, pair), cookies), (e) => upload(e as never));
	if (outcome.kind !== 'value') throw new Error(`unexpected ${outcome.kind}`);
	return { status: outcome.value.status, body: (await outcome.value.json()) as { message?: string; id?: string } };
}
const plansOf = (userId: string) => db.select().from(shootPlans).where(and(eq(shootPlans.userId, userId), eq(shootPlans.assignmentId, assignmentId))).orderBy(shootPlans.id);

beforeAll(async () => {
	await openQueue();
	const found = await findAssignment(SLUG);
	assignmentId = found!.id;
	params = { course: found!.course.slug, lesson: found!.lesson.slug, slug: SLUG };
	learner = await freshLearner();
	await enrol(learner.id);
	learnerCookies = await signedInCookies(learner.email);
	mentorCookies = await signedInCookies(demoAccount('mentor').email);
	pair = await passingPair();
});

afterAll(async () => {
	await removeAttempts(await attemptIdsOf(learner.id));
	await db.delete(auditLog).where(like(auditLog.subject, `${learner.email}:%`));
	await removeFreshPeople();
	await closeQueue();
});

describe('a Shoot Plan before the uploads', () => {
	test('without a plan the upload is refused with what to do, and nothing is stored', async () => {
		const refused = await send();
		expect(refused.status).toBe(422);
		expect(refused.body.message).toMatch(/asks for a Shoot Plan first/);
		expect(await attemptIdsOf(learner.id)).toEqual([]);
	});

	test('a plan with an unticked checklist line, a bad shutter or no Light Plan is refused by the field, and nothing is stored', async () => {
		const unticked = await filePlan(goodPlan({ checked: ['0', '1', '2'] }));
		expect(statusOf(unticked)).toBe(400);
		expect(JSON.stringify(formOf(unticked).errors)).toMatch(/Confirm every line of the safety checklist before filing \(2 left\)/);
		const shutter = await filePlan(goodPlan({ shutter: 'fast' }));
		expect(formOf(shutter).errors).toMatchObject({ shutter: ['Write the shutter time like 1/250.'] });
		const noPlan = await filePlan(goodPlan({ lightPlan: '' }));
		expect(formOf(noPlan).errors).toMatchObject({ lightPlan: [expect.stringMatching(/Arrange the camera/)] });
		expect(await plansOf(learner.id)).toEqual([]);
	});

	test('filed twice while it waits is one plan, revised; uploads stay closed meanwhile', async () => {
		const first = await filePlan(goodPlan());
		expect(formOf(first).message).toEqual({ ok: true, text: expect.stringMatching(/^Plan filed/) });
		const again = await filePlan(goodPlan({ aperture: 'f/5.6' }));
		expect(formOf(again).message?.text).toMatch(/^Plan revised/);
		const rows = await plansOf(learner.id);
		expect(rows).toHaveLength(1);
		expect(rows[0]).toMatchObject({ status: 'waiting', settings: { shutter: '1/250', aperture: 'f/5.6', iso: 200 } });
		expect(rows[0].checklist).toHaveLength(5);
		const refused = await send();
		expect(refused).toMatchObject({ status: 422, body: { message: expect.stringMatching(/waiting for a mentor/) } });
	});

	test('a mentor sees it waiting, must say why to send it back, and a decision on a version they did not read is refused', async () => {
		const listed = await throughHooks(makeEvent({ path: '/mentor/plans', cookies: mentorCookies }), (e) => plansPage.load(e as never));
		const plans = (listed as unknown as { value: { plans: { id: number; learner: string }[] } }).value.plans;
		const [row] = await plansOf(learner.id);
		const name = (await db.query.users.findFirst({ where: eq(users.id, learner.id) }))!.name;
		expect(plans.find((p) => p.id === row.id)).toMatchObject({ learner: name, assignment: 'Rembrandt in motion' });

		const noNote = await decide(row.id, { decision: 'return', note: '', seen: row.createdAt.toISOString() });
		expect(formOf(noNote).errors).toMatchObject({ note: ['Say what to change before sending the plan back.'] });
		const stale = await decide(row.id, { decision: 'approve', note: '', seen: new Date(0).toISOString() });
		expect(statusOf(stale)).toBe(409);
		expect((await plansOf(learner.id))[0].status).toBe('waiting');

		const back = await decide(row.id, { decision: 'return', note: 'Move the stand out of the fall zone, at least 2 m from the mats.', seen: row.createdAt.toISOString() });
		expect(formOf(back).message?.text).toMatch(/^Sent back/);
		expect((await plansOf(learner.id))[0]).toMatchObject({ status: 'returned', mentorNote: 'Move the stand out of the fall zone, at least 2 m from the mats.' });
		const mail = await waitForMail(learner.email, /Your Shoot Plan came back with a note/);
		expect(mail.text).toMatch(/Move the stand out of the fall zone/);
		const audit = await db.select().from(auditLog).where(eq(auditLog.href, `/mentor/plans/${row.id}`));
		expect(audit).toMatchObject([{ action: 'plan.return', actorEmail: demoAccount('mentor').email }]);
		expect(await send()).toMatchObject({ status: 422, body: { message: expect.stringMatching(/sent your Shoot Plan back/) } });
	});

	test('revised after it came back and approved, the uploads open; a second decision on it is refused', async () => {
		await filePlan(goodPlan({ story: 'The stand is 3 m left of the wall, guyed, outside the fall zone and the mats; Ana stays with it.' }));
		const rows = await plansOf(learner.id);
		expect(rows.map((r) => r.status)).toEqual(['returned', 'waiting']);
		const latest = rows[1];
		const ok = await decide(latest.id, { decision: 'approve', note: '', seen: latest.createdAt.toISOString() });
		expect(formOf(ok).message?.text).toMatch(/^Approved: their uploads are open/);
		await waitForMail(learner.email, /Your Shoot Plan is approved/);
		const twice = await decide(latest.id, { decision: 'return', note: 'too late', seen: latest.createdAt.toISOString() });
		expect(statusOf(twice)).toBe(409);
		const sent = await send();
		expect(sent.status).toBe(201);
		const refiled = await filePlan(goodPlan());
		expect(statusOf(refiled)).toBe(409);
		expect(await plansOf(learner.id)).toHaveLength(2);
	});
});

describe('who decides', () => {
	test('a mentor cannot decide on their own plan, nor open it; a learner cannot decide at all', async () => {
		const mentorLearner = await freshLearner();
		await db.update(users).set({ roles: ['learner', 'mentor'] }).where(eq(users.id, mentorLearner.id));
		await enrol(mentorLearner.id);
		const own = await signedInCookies(mentorLearner.email);
		await filePlan(goodPlan(), own);
		const [row] = await plansOf(mentorLearner.id);
		const seen = row.createdAt.toISOString();
		expect(statusOf(await decide(row.id, { decision: 'approve', note: '', seen }, own))).toBe(403);
		const opened = await throughHooks(makeEvent({ path: `/mentor/plans/${row.id}`, cookies: own, params: { id: String(row.id) } }), (e) => planPage.load(e as never));
		expect(opened).toMatchObject({ kind: 'error', status: 403 });
		const listed = await throughHooks(makeEvent({ path: '/mentor/plans', cookies: own }), (e) => plansPage.load(e as never));
		expect((listed as unknown as { value: { plans: { id: number }[] } }).value.plans.some((p) => p.id === row.id)).toBe(false);
		expect(await decide(row.id, { decision: 'approve', note: '', seen }, learnerCookies)).toMatchObject({ kind: 'error', status: 403 });
		expect((await plansOf(mentorLearner.id))[0].status).toBe('waiting');
	});
});
