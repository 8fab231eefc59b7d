// Grading through pg-boss: queued → graded, exactly once under duplicate runs, retried after a failed or killed worker.
import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, afterEach, beforeAll, describe, expect, test } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import postgres from 'postgres';
import { databaseUrl, db } from '$lib/server/db';
import { attemptFrames, attempts } from '$lib/server/db/schema';
import { closeQueue, GRADE_QUEUE, openQueue, queueGrading } from '$lib/server/attempts/queue';
import { requeueStranded, startGradingWorker, type RunningWorker } from '$lib/server/attempts/worker';
import { gradeAttempt, type StoredAnalysis, type StoredResult } from '$lib/server/attempts/grade-job';
import { submitAttempt } from '$lib/server/attempts/submit';
import { readUploadForm } from '$lib/server/attempts/upload-form';
import { freshLearner, removeFreshPeople } from './support/people';
import { ASSIGNMENT, attemptIdsOf, enrol, key, passingPair, removeAttempts, uploadData } from './support/attempts';

let learner: Awaited<ReturnType<typeof freshLearner>>;
let pair: { reference: Buffer; lit: Buffer };
let worker: RunningWorker | null = null;

/** Stores an attempt exactly as the upload route does; the grading job is sent by submitAttempt. */
async function newAttempt(): Promise<string> {
	const form = readUploadForm(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, pair));
	if (!form.ok) throw new Error(form.message);
	const result = await submitAttempt({ id: learner.id, roles: ['learner'] }, form.form);
	if (result.kind !== 'created') throw new Error(result.kind);
	return result.id;
}

async function attemptRow(id: string) {
	return (await db.query.attempts.findFirst({ where: eq(attempts.id, id) }))!;
}

async function waitFor<T>(what: string, probe: () => Promise<T | null | undefined | false>, timeoutMs = 20_000): Promise<T> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const value = await probe();
		if (value) return value;
		if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
		await new Promise((r) => setTimeout(r, 50));
	}
}

const gradedRow = (id: string) => waitFor(`attempt ${id} graded`, async () => {
	const row = await attemptRow(id);
	return row.status === 'graded' ? row : null;
});

beforeAll(async () => {
	// maintenance every second: a job left active by a dead worker is retried within the test's patience
	await openQueue({ maintenanceIntervalSeconds: 1 });
	learner = await freshLearner();
	await enrol(learner.id);
	pair = await passingPair();
});

afterEach(async () => {
	await worker?.stop();
	worker = null;
});

afterAll(async () => {
	await removeAttempts(await attemptIdsOf(learner.id));
	await removeFreshPeople();
	await closeQueue();
});

describe('grading queue', () => {
	test('a queued attempt is graded by the worker: verdict, criteria and each frame as read', async () => {
		worker = await startGradingWorker();
		const id = await newAttempt();
		const row = await gradedRow(id);
		expect(row).toMatchObject({ status: 'graded', autoVerdict: 'pass', verdict: 'pass', gradeRuns: 1, error: null });
		const result = row.result as StoredResult;
		expect(result.criteria.map((c) => [c.kind, c.verdict])).toEqual([
			['ambient-under', 'pass'],
			['subject-lift', 'pass'],
			['background-drop', 'pass'],
			['flash-evidence', 'pass']
		]);
		// log2(1500/500) = 1.585 stops under the reference (APEX, ASA PH2.5-1960)
		expect(result.criteria[0].measured as number).toBeCloseTo(Math.log2(3), 3);
		const frames = await db.select().from(attemptFrames).where(eq(attemptFrames.attemptId, id));
		for (const f of frames) {
			const analysis = f.analysis as StoredAnalysis;
			expect(analysis.ok).toBe(true);
			if (analysis.ok) expect(analysis.frame.pixels?.histogram).toHaveLength(256);
			expect([f.width, f.height]).toEqual([600, 400]);
		}
		const job = await (await openQueue()).getJobById(GRADE_QUEUE, id);
		expect(job?.state).toBe('completed');
	});

	test('two runs of the same attempt at once store one result; the loser changes nothing', async () => {
		const boss = await openQueue();
		const id = await newAttempt();
		// no worker is running: take the job out so only the two direct runs below grade it
		await boss.deleteJob(GRADE_QUEUE, id);
		const outcomes = await Promise.all([gradeAttempt(id), gradeAttempt(id)]);
		expect(outcomes.sort()).toEqual(['already-graded', 'graded']);
		const row = await attemptRow(id);
		expect(row).toMatchObject({ status: 'graded', gradeRuns: 2 });
		const gradedAt = row.gradedAt;
		// a third, later run does not even claim it
		expect(await gradeAttempt(id)).toBe('already-graded');
		expect(await attemptRow(id)).toMatchObject({ gradeRuns: 2, gradedAt });
	});

	test('a run that throws after partial work is retried by pg-boss, and the attempt is graded once', async () => {
		let runs = 0;
		worker = await startGradingWorker({
			checkpoint: () => {
				runs++;
				if (runs === 1) throw new Error('worker fell over after reading the frames');
			}
		});
		const id = await newAttempt();
		const row = await gradedRow(id);
		expect(runs).toBe(2);
		expect(row).toMatchObject({ status: 'graded', verdict: 'pass', gradeRuns: 2 });
		const job = await waitFor('job completed', async () => {
			const j = await (await openQueue()).getJobById(GRADE_QUEUE, id);
			return j?.state === 'completed' ? j : null;
		});
		expect(job).toMatchObject({ retryCount: 1 });
	});

	test('when every retry fails, the attempt is marked as an error for a mentor, not left grading', async () => {
		worker = await startGradingWorker({
			checkpoint: () => {
				throw new Error('always broken');
			}
		});
		const id = await newAttempt();
		const row = await waitFor(
			'attempt marked error',
			async () => {
				const r = await attemptRow(id);
				return r.status === 'error' ? r : null;
			},
			40_000
		);
		// retryLimit 3: the first run and three retries
		expect(row.gradeRuns).toBe(4);
		expect(row.error).toMatch(/A mentor will look at this attempt/);
		expect(row.verdict).toBeNull();
	}, 60_000);

	test('an attempt stored but never queued (the app died before sending) is sent again, once', async () => {
		const boss = await openQueue();
		const id = await newAttempt();
		await boss.deleteJob(GRADE_QUEUE, id);
		await db.update(attempts).set({ createdAt: new Date(Date.now() - 5 * 60_000) }).where(eq(attempts.id, id));
		expect(await requeueStranded()).toBeGreaterThanOrEqual(1);
		expect((await boss.getJobById(GRADE_QUEUE, id))?.data).toEqual({ attemptId: id });
		// its job exists now: a second sweep sends nothing for it
		const before = await boss.getJobById(GRADE_QUEUE, id);
		await requeueStranded();
		expect((await boss.getJobById(GRADE_QUEUE, id))?.createdOn).toEqual(before?.createdOn);
		worker = await startGradingWorker();
		expect(await gradedRow(id)).toMatchObject({ status: 'graded', gradeRuns: 1 });
	});

	test('a worker process killed in the middle of a job: the job is retried and the attempt graded once', async () => {
		const boss = await openQueue();
		const id = await newAttempt();
		// resend with a short expiry, so the dead worker's job times out within the test
		await boss.deleteJob(GRADE_QUEUE, id);

		const holder = postgres(databaseUrl, { max: 1, onnotice: () => {} });
		let child: ChildProcess | null = null;
		try {
			await holder.begin(async (tx) => {
				// hold the frame rows: the child reads and grades, then blocks storing its result
				await tx`select id from attempt_frames where attempt_id = ${id} for update`;
				// node itself with tsx's loader: one process, so the kill reaches the worker (the tsx CLI would leave it running)
				child = spawn(process.execPath, ['--import', 'tsx', 'scripts/worker.ts'], {
					env: { ...process.env, DATABASE_URL: databaseUrl },
					stdio: ['ignore', 'pipe', 'inherit']
				});
				await new Promise<void>((resolve, reject) => {
					child!.stdout!.on('data', (chunk: Buffer) => chunk.toString().includes('ready') && resolve());
					child!.on('exit', (code) => reject(new Error(`worker exited early with ${code}`)));
				});
				await queueGrading(id, { expireInSeconds: 3 });
				// asked outside the holding transaction: pg_stat_activity is a snapshot within one transaction
				await waitFor('the child to block on the held rows', async () => {
					const [row] = (await db.execute(sql`select count(*)::int as n from pg_stat_activity where datname = current_database() and wait_event_type = 'Lock'`)) as unknown as { n: number }[];
					return row.n > 0;
				});
				const mid = await attemptRow(id);
				expect(mid).toMatchObject({ status: 'grading', gradeRuns: 1 });
				const exited = new Promise((resolve) => child!.on('exit', resolve));
				child!.kill('SIGKILL');
				await exited;
			});
		} finally {
			if (child && (child as ChildProcess).exitCode === null) (child as ChildProcess).kill('SIGKILL');
			await holder.end();
		}

		// a fresh worker picks up the retry once maintenance expires the dead worker's job
		worker = await startGradingWorker();
		const row = await gradedRow(id);
		expect(row).toMatchObject({ status: 'graded', verdict: 'pass', gradeRuns: 2 });
		const frames = await db.select().from(attemptFrames).where(eq(attemptFrames.attemptId, id));
		expect(frames.every((f) => (f.analysis as StoredAnalysis).ok)).toBe(true);
		const job = await waitFor('job completed', async () => {
			const j = await boss.getJobById(GRADE_QUEUE, id);
			return j?.state === 'completed' ? j : null;
		});
		expect(job.retryCount).toBe(1);
	}, 60_000);
});
