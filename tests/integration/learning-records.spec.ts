// Learning records end to end against the LRS fake: each event writes a valid xAPI 1.0.3 statement into the outbox in
// its own transaction; delivery sends each once; an LRS that is down leaves them waiting and a later run sends them;
// sending again is harmless; the pg-boss job delivers on its own.
import { spawn, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { and, asc, eq, inArray } from 'drizzle-orm';
import validation from '@learninglocker/xapi-validation';
import { db } from '$lib/server/db';
import { courses, learningRecords, lessons, modules } from '$lib/server/db/schema';
import { closeQueue, openQueue } from '$lib/server/attempts/queue';
import { saveReview } from '$lib/server/review/save';
import { saveQuizAnswer, setLessonComplete } from '$lib/server/progress';
import { deliverWaiting } from '$lib/server/learning-records/deliver';
import { deliverSoon } from '$lib/server/learning-records/outbox';
import { lrsSettings, recordsOrigin, type LrsSettings } from '$lib/server/learning-records/settings';
import { retryNow, learningRecordsOverview } from '$lib/server/learning-records/admin';
import { startDeliveryWorker } from '$lib/server/learning-records/worker';
import { demoAccount, freshLearner, removeFreshPeople, userIdOf } from './support/people';
import { COURSE, attemptIdsOf, enrol, gradedAttemptOf, removeAttempts } from './support/attempts';

const validate = ((validation as unknown as { default?: typeof validation }).default ?? validation) as (s: unknown) => unknown[];
const SERVER = fileURLToPath(new URL('../../fakes/lrs/server.mjs', import.meta.url));
const USER = 'spec-user';
const PASSWORD = 'spec-secret';

type Fake = { child: ChildProcess; port: number; dir: string };
type Stored = { id: string; verb: { id: string }; object: { id: string }; actor: unknown };

async function startFake(dir: string, port = 0): Promise<Fake> {
	const child = spawn(process.execPath, [SERVER], {
		env: { ...process.env, FAKE_LRS_PORT: String(port), FAKE_LRS_DIR: dir, FAKE_LRS_USER: USER, FAKE_LRS_PASSWORD: PASSWORD, STOPWISE_LRS_ENDPOINT: '' },
		stdio: ['ignore', 'pipe', 'inherit']
	});
	const bound = await new Promise<number>((resolve, reject) => {
		let out = '';
		child.stdout?.on('data', (chunk: Buffer) => {
			out += chunk.toString();
			const match = /ready: fake LRS on http:\/\/127\.0\.0\.1:(\d+)\//.exec(out);
			if (match) resolve(Number(match[1]));
		});
		child.on('close', (code) => reject(new Error(`fake LRS exited with ${code}`)));
	});
	return { child, port: bound, dir };
}

async function stopFake(fake: Fake): Promise<void> {
	if (fake.child.exitCode !== null) return;
	const exited = once(fake.child, 'exit');
	fake.child.kill('SIGTERM');
	await exited;
}

/** A port nothing listens on: bound once, then closed. */
async function closedPort(): Promise<number> {
	const server = createServer();
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	const { port } = server.address() as { port: number };
	await new Promise((resolve) => server.close(resolve));
	return port;
}

const settingsFor = (port: number, password = PASSWORD): LrsSettings =>
	lrsSettings({ STOPWISE_LRS_ENDPOINT: `http://127.0.0.1:${port}/xapi`, STOPWISE_LRS_USER: USER, STOPWISE_LRS_PASSWORD: password })!;

async function storedFor(fake: Fake, userId: string): Promise<Stored[]> {
	const agent = JSON.stringify({ account: { homePage: recordsOrigin(), name: userId } });
	const response = await fetch(`http://127.0.0.1:${fake.port}/xapi/statements?ascending=true&agent=${encodeURIComponent(agent)}`, {
		headers: { 'X-Experience-API-Version': '1.0.3', Authorization: `Basic ${Buffer.from(`${USER}:${PASSWORD}`).toString('base64')}` }
	});
	expect(response.status).toBe(200);
	expect(response.headers.get('x-experience-api-version')).toBe('1.0.3');
	return ((await response.json()) as { statements: Stored[] }).statements;
}

const rowsOf = (userId: string) => db.select().from(learningRecords).where(eq(learningRecords.userId, userId)).orderBy(asc(learningRecords.createdAt));

async function courseLessons(): Promise<number[]> {
	const rows = await db
		.select({ id: lessons.id })
		.from(lessons)
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(and(eq(courses.slug, COURSE), eq(lessons.published, true)))
		.orderBy(asc(modules.position), asc(lessons.position));
	return rows.map((r) => r.id);
}

let dir: string;
let fake: Fake;
let learner: Awaited<ReturnType<typeof freshLearner>>;
let mentor: { id: string; email: string };
let attemptId: string;

beforeAll(async () => {
	dir = mkdtempSync(join(tmpdir(), 'stopwise-lrs-'));
	fake = await startFake(dir);
	await openQueue();
	mentor = { id: await userIdOf(demoAccount('mentor').email), email: demoAccount('mentor').email };
	learner = await freshLearner();
	await enrol(learner.id);
	// anything other suites left waiting goes first, so this file's counts are its own
	await deliverWaiting(settingsFor(fake.port));
});

afterAll(async () => {
	await removeAttempts(await attemptIdsOf(learner.id));
	await removeFreshPeople();
	await closeQueue();
	await stopFake(fake);
	rmSync(dir, { recursive: true, force: true });
});

describe('learning records', () => {
	test('each event writes its statement into the outbox, valid xAPI 1.0.3', async () => {
		const [first, ...rest] = await courseLessons();
		await saveQuizAnswer(learner.id, first, 'q1', '3', false);
		await setLessonComplete(learner.id, first, true);
		// completing again, or undoing and redoing, is the same first completion: no second statement
		await setLessonComplete(learner.id, first, false);
		await setLessonComplete(learner.id, first, true);

		attemptId = await gradedAttemptOf(learner.id);
		const review = await saveReview(mentor, attemptId, { text: 'The rim light holds the shoulder.', rubric: { moment: 4 }, verdict: 'needs-review', reason: 'The flash bit is unset; checking the trigger.' });
		expect(review.ok).toBe(true);
		for (const id of rest) await setLessonComplete(learner.id, id, true);

		const rows = await rowsOf(learner.id);
		const kinds = rows.map((r) => r.kind);
		expect(kinds.filter((k) => k === 'lesson-completed')).toHaveLength(rest.length + 1);
		for (const kind of ['quiz-answered', 'attempt-submitted', 'critique-received', 'course-completed'] as const) expect(kinds.filter((k) => k === kind)).toHaveLength(1);
		// the automatic verdict and the mentor's change
		expect(kinds.filter((k) => k === 'verdict-received')).toHaveLength(2);
		for (const row of rows) {
			expect(validate(row.statement)).toEqual([]);
			expect(row.statement.id).toBe(row.id);
			expect(row.sentAt).toBeNull();
		}
		const course = rows.find((r) => r.kind === 'course-completed')!;
		expect((course.statement.object as { id: string }).id).toBe(`${recordsOrigin()}/xapi/activities/course/${COURSE}`);
	});

	test('delivery sends each statement once, and the LRS holds exactly what was recorded', async () => {
		const report = await deliverWaiting(settingsFor(fake.port));
		expect(report).toMatchObject({ configured: true, error: null, rejected: 0 });
		const rows = await rowsOf(learner.id);
		expect(rows.every((r) => r.sentAt !== null && r.tries === 1 && r.lrsStatus === 200)).toBe(true);
		const stored = await storedFor(fake, learner.id);
		expect(stored.map((s) => s.id).sort()).toEqual(rows.map((r) => r.id).sort());
		// nothing waits: a second run sends nothing
		expect(await deliverWaiting(settingsFor(fake.port))).toMatchObject({ sent: 0, alreadyHeld: 0 });
	});

	test('an LRS that is down leaves statements waiting with the error; a later run delivers them once', async () => {
		const lessonIds = await courseLessons();
		await saveQuizAnswer(learner.id, lessonIds[1], 'q2', '1', true);
		const down = await deliverWaiting(settingsFor(await closedPort()));
		expect(down.error).toMatch(/No answer from the LRS/);
		const [waiting] = (await rowsOf(learner.id)).filter((r) => r.sentAt === null);
		expect(waiting).toMatchObject({ kind: 'quiz-answered', tries: 1, lrsStatus: null, rejected: false });
		expect(waiting.lastError).toMatch(/No answer from the LRS/);
		expect((await learningRecordsOverview()).lastError?.message).toMatch(/No answer from the LRS/);

		// wrong credentials: the LRS says 401, which is a setting to fix, not a bad statement; it stays waiting
		const refused = await deliverWaiting(settingsFor(fake.port, 'wrong'));
		expect(refused.error).toMatch(/401/);
		expect((await db.query.learningRecords.findFirst({ where: eq(learningRecords.id, waiting.id) }))).toMatchObject({ rejected: false, lrsStatus: 401, sentAt: null });

		const later = await deliverWaiting(settingsFor(fake.port));
		expect(later).toMatchObject({ sent: 1, error: null });
		const stored = await storedFor(fake, learner.id);
		expect(stored.filter((s) => s.id === waiting.id)).toHaveLength(1);
	});

	test('sending a statement again is harmless: the LRS keeps one, and a repeated PUT answers 204', async () => {
		const [row] = await rowsOf(learner.id);
		const before = (await storedFor(fake, learner.id)).length;
		// as if the process died after the LRS took it but before the outbox noted it
		await db.update(learningRecords).set({ sentAt: null }).where(eq(learningRecords.id, row.id));
		expect(await deliverWaiting(settingsFor(fake.port))).toMatchObject({ sent: 1, error: null });
		expect(await storedFor(fake, learner.id)).toHaveLength(before);

		const headers = { 'X-Experience-API-Version': '1.0.3', 'Content-Type': 'application/json', Authorization: `Basic ${Buffer.from(`${USER}:${PASSWORD}`).toString('base64')}` };
		const url = `http://127.0.0.1:${fake.port}/xapi/statements?statementId=${row.id}`;
		for (let i = 0; i < 2; i++) expect((await fetch(url, { method: 'PUT', headers, body: JSON.stringify(row.statement) })).status).toBe(204);
		const other = { ...row.statement, verb: { id: 'http://adlnet.gov/expapi/verbs/experienced' } };
		expect((await fetch(url, { method: 'PUT', headers, body: JSON.stringify(other) })).status).toBe(409);
		expect(await storedFor(fake, learner.id)).toHaveLength(before);
	});

	test('a statement the LRS calls malformed is set aside without holding up the rest; retry puts it back', async () => {
		const badId = '2d1c5a9f-3e70-4f2b-9d0e-9c314a578e6b';
		await db.insert(learningRecords).values({ id: badId, kind: 'quiz-answered', userId: learner.id, statement: { id: badId, actor: {}, verb: { id: 'not an IRI' }, object: {} } });
		const lessonIds = await courseLessons();
		await saveQuizAnswer(learner.id, lessonIds[2], 'q3', '2', true);
		const report = await deliverWaiting(settingsFor(fake.port));
		expect(report).toMatchObject({ rejected: 1, sent: 1, error: null });
		const bad = (await db.query.learningRecords.findFirst({ where: eq(learningRecords.id, badId) }))!;
		expect(bad).toMatchObject({ rejected: true, lrsStatus: 400, sentAt: null });
		expect(bad.lastError).toMatch(/400.*Invalid statement/);
		expect((await learningRecordsOverview()).rejected).toBeGreaterThanOrEqual(1);
		expect(await retryNow()).toBeGreaterThanOrEqual(1);
		expect((await db.query.learningRecords.findFirst({ where: eq(learningRecords.id, badId) }))!.rejected).toBe(false);
		await db.delete(learningRecords).where(inArray(learningRecords.id, [badId]));
	});

	test('without an LRS configured, statements wait and nothing is sent', async () => {
		const lessonIds = await courseLessons();
		await saveQuizAnswer(learner.id, lessonIds[3], 'q4', '1', true);
		expect(await deliverWaiting(null)).toEqual({ configured: false, sent: 0, alreadyHeld: 0, rejected: 0, error: null });
		expect((await rowsOf(learner.id)).filter((r) => r.sentAt === null)).toHaveLength(1);
	});

	test('an endpoint that is not a URL: the admin page names the problem, nothing is sent, nothing fails', async () => {
		const saved = process.env.STOPWISE_LRS_ENDPOINT;
		process.env.STOPWISE_LRS_ENDPOINT = 'lrs.example.org/xapi';
		try {
			const overview = await learningRecordsOverview();
			expect(overview).toMatchObject({ endpoint: null, problem: expect.stringMatching(/not a URL/) });
			expect(overview.backlog.length).toBeGreaterThanOrEqual(1);
			expect(await deliverWaiting()).toMatchObject({ configured: false, sent: 0 });
		} finally {
			if (saved === undefined) delete process.env.STOPWISE_LRS_ENDPOINT;
			else process.env.STOPWISE_LRS_ENDPOINT = saved;
		}
	});

	test('the pg-boss job delivers on its own once woken', async () => {
		const saved = { ...process.env };
		Object.assign(process.env, { STOPWISE_LRS_ENDPOINT: `http://127.0.0.1:${fake.port}/xapi/`, STOPWISE_LRS_USER: USER, STOPWISE_LRS_PASSWORD: PASSWORD });
		const worker = await startDeliveryWorker(await openQueue());
		try {
			deliverSoon();
			const deadline = Date.now() + 20_000;
			let waiting = 1;
			while (waiting > 0 && Date.now() < deadline) {
				await new Promise((r) => setTimeout(r, 100));
				waiting = (await rowsOf(learner.id)).filter((r) => r.sentAt === null).length;
			}
			expect(waiting).toBe(0);
			const rows = await rowsOf(learner.id);
			expect((await storedFor(fake, learner.id)).map((s) => s.id).sort()).toEqual(rows.map((r) => r.id).sort());
		} finally {
			await worker.stop();
			process.env.STOPWISE_LRS_ENDPOINT = saved.STOPWISE_LRS_ENDPOINT;
			process.env.STOPWISE_LRS_USER = saved.STOPWISE_LRS_USER;
			process.env.STOPWISE_LRS_PASSWORD = saved.STOPWISE_LRS_PASSWORD;
			for (const name of ['STOPWISE_LRS_ENDPOINT', 'STOPWISE_LRS_USER', 'STOPWISE_LRS_PASSWORD']) if (saved[name] === undefined) delete process.env[name];
		}
	});
});
