// Resumable frame uploads (tus) against the real PostgreSQL: parts, resuming after a cut, exactly one attempt per
// submission key, no more parts than frames, only the learner's own uploads, and the sweep of what is left behind.
import { existsSync, statSync } from 'node:fs';
import { mkdir, utimes, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { attemptFrames, frameUploads } from '$lib/server/db/schema';
import { dataDir, fileStore } from '$lib/server/storage';
import { closeQueue, openQueue, SWEEP_CRON, SWEEP_QUEUE } from '$lib/server/attempts/queue';
import { startGradingWorker } from '$lib/server/attempts/worker';
import { sql } from 'drizzle-orm';
import { uploadDir } from '$lib/server/attempts/uploads/folder';
import { sweepUploads } from '$lib/server/attempts/uploads/sweep';
import { POST as postAttempt } from '../../src/routes/api/v1/attempts/+server';
import { throughHooks, type TestCookies } from './support/request-event';
import { finishAttempt, idOf, sendParts, start, tus, uploadFrame } from './support/tus';
import { freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { ASSIGNMENT, attemptIdsOf, enrol, key, multipartEvent, passingPair, removeAttempts, uploadData } from './support/attempts';

type Learner = Awaited<ReturnType<typeof freshLearner>>;
let learner: Learner;
let outsider: Learner;
let mine: TestCookies;
let theirs: TestCookies;
let pair: { reference: Buffer; lit: Buffer };

const rowsOf = (userId: string) => db.select().from(frameUploads).where(eq(frameUploads.userId, userId));

beforeAll(async () => {
	await openQueue();
	learner = await freshLearner();
	outsider = await freshLearner();
	await enrol(learner.id);
	await enrol(outsider.id);
	mine = await signedInCookies(learner.email);
	theirs = await signedInCookies(outsider.email);
	pair = await passingPair();
});

afterAll(async () => {
	await removeAttempts([...(await attemptIdsOf(learner.id)), ...(await attemptIdsOf(outsider.id))]);
	await removeFreshPeople();
	await closeQueue();
});

describe('resumable frame uploads', () => {
	test('frames sent in parts make exactly one attempt; sending again answers with the same attempt', async () => {
		const submission = key();
		const locations = [await uploadFrame(mine, 'reference', pair.reference, submission), await uploadFrame(mine, 'lit', pair.lit, submission)];
		expect((await rowsOf(learner.id)).every((r) => r.finishedAt !== null)).toBe(true);

		const first = await finishAttempt(mine, submission);
		expect(first.status).toBe(201);
		const again = await finishAttempt(mine, submission);
		expect(again).toMatchObject({ status: 200, body: { id: first.body.id, duplicate: true } });
		expect((await attemptIdsOf(learner.id)).filter((id) => id === first.body.id)).toHaveLength(1);

		const frames = await db.select().from(attemptFrames).where(eq(attemptFrames.attemptId, first.body.id));
		expect(frames.map((f) => f.name).sort()).toEqual(['lit', 'reference']);
		for (const f of frames) expect((await fileStore().get(f.originalKey))?.equals(f.name === 'lit' ? pair.lit : pair.reference)).toBe(true);
		// the uploads are gone once their attempt is stored
		expect(await rowsOf(learner.id)).toEqual([]);
		for (const l of locations) expect(existsSync(join(uploadDir(), idOf(l)))).toBe(false);
		// and a new upload for that key is refused: the frames were sent
		expect((await start(mine, 'lit', 100, submission)).status).toBe(409);
	});

	test('a PATCH cut off mid-way resumes from the offset HEAD reports', async () => {
		const submission = key();
		const created = await start(mine, 'lit', pair.lit.length, submission);
		const location = created.headers.get('location')!;
		const half = Math.floor(pair.lit.length / 2);
		// the connection drops once half the bytes of this part have reached the server's upload file (waiting for them,
		// not for a fixed time, so a slow machine cuts at the same place)
		const file = join(uploadDir(), idOf(location));
		const arrived = async () => {
			for (let tries = 0; tries < 400; tries++) {
				if (existsSync(file) && statSync(file).size >= half) return;
				await new Promise((r) => setTimeout(r, 25));
			}
		};
		const cut = new ReadableStream<Uint8Array>({
			start(controller) {
				controller.enqueue(new Uint8Array(pair.lit.subarray(0, half)));
				void arrived().then(() => controller.error(new Error('connection reset')));
			}
		});
		// (the learner's phone never sees this answer: its connection is gone)
		await tus('PATCH', location, mine, { 'upload-offset': '0', 'content-type': 'application/offset+octet-stream' }, cut);

		const head = await tus('HEAD', location, mine, {});
		expect(head.status).toBe(200);
		const offset = Number(head.headers.get('upload-offset'));
		// every byte that arrived before the cut is kept
		expect(offset).toBe(half);
		expect(head.headers.get('upload-length')).toBe(String(pair.lit.length));
		// a part sent from the wrong place is refused without changing anything
		expect((await tus('PATCH', location, mine, { 'upload-offset': '0', 'content-type': 'application/offset+octet-stream' }, new Uint8Array(pair.lit.subarray(0, 10)))).status).toBe(409);

		expect(await sendParts(mine, location, pair.lit, 64 * 1024, offset)).toBe(pair.lit.length);
		await uploadFrame(mine, 'reference', pair.reference, submission);
		const made = await finishAttempt(mine, submission);
		expect(made.status).toBe(201);
		const frames = await db.select().from(attemptFrames).where(eq(attemptFrames.attemptId, made.body.id));
		const lit = frames.find((f) => f.name === 'lit')!;
		expect((await fileStore().get(lit.originalKey))?.equals(pair.lit)).toBe(true);
	});

	test('no more parts than frames: a frame the assignment does not have is refused by name, in both ways of sending', async () => {
		const refused = await start(mine, 'extra', 1000, key());
		expect(refused.status).toBe(422);
		expect(JSON.parse(refused.text)).toMatchObject({ error: 'too-many-parts', message: expect.stringMatching(/takes 2 frames \(“reference”, “lit”\); there is no “extra” frame/) });

		const data = uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, { ...pair, extra: pair.lit });
		const outcome = await throughHooks(multipartEvent('/api/v1/attempts', data, mine), (e) => postAttempt(e as never));
		if (outcome.kind !== 'value') throw new Error('expected a value');
		expect(outcome.value.status).toBe(422);
		expect(await outcome.value.json()).toMatchObject({ error: 'too-many-parts', message: expect.stringMatching(/also carried “extra”/) });
	});

	test('a frame larger than the limit, an unfinished frame and a missing frame are refused with a clear message', async () => {
		const tooBig = await start(mine, 'lit', 41 * 1024 * 1024, key());
		expect(tooBig.status).toBe(413);
		expect(JSON.parse(tooBig.text).message).toMatch(/the limit is 40 MB/);

		const submission = key();
		await uploadFrame(mine, 'reference', pair.reference, submission);
		const early = await finishAttempt(mine, submission);
		expect(early.status).toBe(422);
		expect(early.body.frames.lit).toMatch(/“lit” frame is missing/);

		const started = await start(mine, 'lit', pair.lit.length, submission);
		await sendParts(mine, started.headers.get('location')!, pair.lit.subarray(0, 1000), 1000);
		const unfinished = await finishAttempt(mine, submission);
		expect(unfinished.status).toBe(422);
		expect(unfinished.body.frames.lit).toMatch(/not finished uploading/);
	});

	test('only the signed-in, enrolled learner who started an upload may resume, read or cancel it', async () => {
		const submission = key();
		const created = await start(mine, 'lit', pair.lit.length, submission);
		const location = created.headers.get('location')!;

		expect((await tus('HEAD', location, theirs, {})).status).toBe(404);
		expect((await tus('PATCH', location, theirs, { 'upload-offset': '0', 'content-type': 'application/offset+octet-stream' }, new Uint8Array(10))).status).toBe(404);
		expect((await tus('DELETE', location, theirs, {})).status).toBe(404);
		expect((await tus('HEAD', location, undefined, {})).status).toBe(401);
		expect((await tus('POST', '/api/v1/uploads', undefined, { 'upload-length': '10' })).status).toBe(401);
		// the other learner's key cannot reach this upload either
		expect((await finishAttempt(theirs, submission)).body.frames?.lit).toMatch(/missing/);

		const stranger = await freshLearner();
		const unenrolled = await start(await signedInCookies(stranger.email), 'lit', 100, key());
		expect(unenrolled.status).toBe(403);

		// its own learner cancels it: row and bytes gone
		expect((await tus('DELETE', location, mine, {})).status).toBe(204);
		expect((await rowsOf(learner.id)).find((r) => r.id === idOf(location))).toBeUndefined();
		expect(existsSync(join(uploadDir(), idOf(location)))).toBe(false);
		expect((await tus('HEAD', location, mine, {})).status).toBe(404);
	});

	test('cancelling a submission by its key removes all its frames, and only for its own learner', async () => {
		const submission = key();
		await start(mine, 'reference', 1000, submission);
		await start(mine, 'lit', 1000, submission);
		const cancel = (cookies: TestCookies, k: string) => tus('DELETE', `/api/v1/uploads?submissionKey=${k}`, cookies, {});
		expect((await cancel(theirs, submission)).status).toBe(404);
		expect((await rowsOf(learner.id)).filter((r) => r.submissionKey === submission)).toHaveLength(2);
		expect((await cancel(mine, submission)).status).toBe(204);
		expect((await rowsOf(learner.id)).filter((r) => r.submissionKey === submission)).toEqual([]);
		expect((await cancel(mine, submission)).status).toBe(404);
	});

	test('a learner keeps at most three other submissions in transit: starting a fifth drops the oldest', async () => {
		const busy = await freshLearner();
		await enrol(busy.id);
		const cookies = await signedInCookies(busy.email);
		const keys = [key(), key(), key(), key(), key()];
		for (const k of keys.slice(0, 4)) expect((await start(cookies, 'lit', 1000, k)).status).toBe(201);
		expect(new Set((await rowsOf(busy.id)).map((r) => r.submissionKey))).toEqual(new Set(keys.slice(0, 4)));
		expect((await start(cookies, 'lit', 1000, keys[4])).status).toBe(201);
		expect(new Set((await rowsOf(busy.id)).map((r) => r.submissionKey))).toEqual(new Set(keys.slice(1)));
	});

	test('the sweep removes expired uploads, stray bytes and attempt folders no attempt owns, and nothing else', async () => {
		const stale = await start(mine, 'reference', 1000, key());
		const staleId = idOf(stale.headers.get('location')!);
		const fresh = await start(mine, 'reference', 1000, key());
		const freshId = idOf(fresh.headers.get('location')!);
		await db.update(frameUploads).set({ createdAt: new Date(Date.now() - 25 * 3600_000) }).where(eq(frameUploads.id, staleId));

		const old = new Date(Date.now() - 3 * 3600_000);
		const strayId = 'ab'.repeat(16);
		await writeFile(join(uploadDir(), strayId), 'bytes');
		await writeFile(join(uploadDir(), `${strayId}.json`), '{}');
		for (const f of [strayId, `${strayId}.json`]) await utimes(join(uploadDir(), f), old, old);
		const orphan = join(dataDir, 'attempts', 'orphan-of-a-crash');
		await mkdir(orphan, { recursive: true });
		await writeFile(join(orphan, '0-original.jpg'), 'x');
		await utimes(orphan, old, old);
		const kept = (await attemptIdsOf(learner.id))[0];

		const report = await sweepUploads();
		expect(report.uploads).toBeGreaterThanOrEqual(1);
		expect(report.strayFiles).toBeGreaterThanOrEqual(1);
		expect(report.orphanAttemptFolders).toBeGreaterThanOrEqual(1);
		expect(existsSync(join(uploadDir(), staleId))).toBe(false);
		expect(existsSync(join(uploadDir(), strayId))).toBe(false);
		expect(existsSync(orphan)).toBe(false);
		expect((await rowsOf(learner.id)).map((r) => r.id)).toContain(freshId);
		expect((await rowsOf(learner.id)).map((r) => r.id)).not.toContain(staleId);
		expect(existsSync(join(uploadDir(), freshId))).toBe(true);
		expect(existsSync(join(dataDir, 'attempts', kept))).toBe(true);
		// an expired upload answers 404 to its learner afterwards
		expect((await tus('HEAD', `/api/v1/uploads/${staleId}`, mine, {})).status).toBe(404);
	});

	test('the sweep is a pg-boss cron job that the workers schedule and run, not a timer of the web process', async () => {
		const worker = await startGradingWorker();
		try {
			const rows = await db.execute(sql`select name, cron from pgboss.schedule where name = ${SWEEP_QUEUE}`);
			expect([...rows]).toEqual([{ name: SWEEP_QUEUE, cron: SWEEP_CRON }]);
		} finally {
			await worker.stop();
		}
	});
});
