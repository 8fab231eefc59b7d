// Uploading an Attempt through POST /api/v1/attempts: stored whole or not at all, once per submission key.
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { attemptFrames, attempts, users } from '$lib/server/db/schema';
import { dataDir, fileStore, useFileStore, type FileStore } from '$lib/server/storage';
import { closeQueue, GRADE_QUEUE, openQueue } from '$lib/server/attempts/queue';
import { gradeAttempt } from '$lib/server/attempts/grade-job';
import { loadAttemptView } from '$lib/server/attempts/view';
import { POST } from '../../src/routes/api/v1/attempts/+server';
import { throughHooks } from './support/request-event';
import { freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { ASSIGNMENT, attemptIdsOf, enrol, key, multipartEvent, passingPair, removeAttempts, uploadData } from './support/attempts';

type Learner = Awaited<ReturnType<typeof freshLearner>>;
let learner: Learner;
let outsider: Learner;
let pair: { reference: Buffer; lit: Buffer };

async function post(data: FormData | string, who: Learner = learner, headers: Record<string, string> = {}) {
	const cookies = await signedInCookies(who.email);
	const outcome = await throughHooks(multipartEvent('/api/v1/attempts', data, cookies, headers), (e) => POST(e as never));
	if (outcome.kind !== 'value') throw new Error(`unexpected ${outcome.kind}`);
	return { status: outcome.value.status, body: await outcome.value.json() };
}

const folderOf = (id: string) => join(dataDir, 'attempts', id);

beforeAll(async () => {
	await openQueue();
	learner = await freshLearner();
	outsider = await freshLearner();
	await enrol(learner.id);
	pair = await passingPair();
});

afterAll(async () => {
	await removeAttempts([...(await attemptIdsOf(learner.id)), ...(await attemptIdsOf(outsider.id))]);
	await removeFreshPeople();
	await closeQueue();
});

describe('POST /api/v1/attempts', () => {
	test('stores both originals and display copies, the rows, and queues one grading job', async () => {
		const { status, body } = await post(uploadData({ assignment: ASSIGNMENT, submissionKey: key(), subjectBox: '0.3,0.2,0.4,0.6' }, pair));
		expect(status).toBe(201);
		expect(body.href).toBe(`/attempts/${body.id}`);
		const row = await db.query.attempts.findFirst({ where: eq(attempts.id, body.id) });
		expect(row).toMatchObject({ status: 'queued', gradeRuns: 0, subjectBox: { x: 0.3, y: 0.2, w: 0.4, h: 0.6 }, lightPlan: null });
		const frames = await db.select().from(attemptFrames).where(eq(attemptFrames.attemptId, body.id));
		expect(frames.map((f) => f.name).sort()).toEqual(['lit', 'reference']);
		for (const f of frames) {
			expect(f.mime).toBe('image/jpeg');
			expect((await fileStore().get(f.originalKey))?.equals(f.name === 'lit' ? pair.lit : pair.reference)).toBe(true);
			expect((await fileStore().get(f.largeKey))?.subarray(8, 12).toString()).toBe('WEBP');
			expect((await fileStore().get(f.thumbKey))?.subarray(8, 12).toString()).toBe('WEBP');
		}
		const boss = await openQueue();
		const job = await boss.getJobById(GRADE_QUEUE, body.id);
		expect(job?.data).toEqual({ attemptId: body.id });
	});

	test('keeps what flash was used with the attempt, and the verdict shows the level it predicts beside the measured one', async () => {
		const data = uploadData({ assignment: ASSIGNMENT, submissionKey: key(), flashGn: '60', flashPower: '1/4', flashDistance: '3' }, pair);
		const { status, body } = await post(data);
		expect(status).toBe(201);
		const row = await db.query.attempts.findFirst({ where: eq(attempts.id, body.id) });
		expect(row?.flashUsed).toEqual({ gn: 60, power: 0.25, distance: 3 });
		expect(await gradeAttempt(body.id)).toBe('graded');
		const view = await loadAttemptView({ id: learner.id, roles: ['learner'] }, body.id);
		expect(view?.flashUsed).toBe('guide number 60, 1/4 power, 3 m from the subject');
		const lift = view?.criteria.find((c) => c.kind === 'subject-lift');
		expect(lift?.evidence.map((e) => e.key)).toEqual(expect.arrayContaining(['measured', 'predicted']));
	});

	test('refuses a flash setting that cannot be one, and stores nothing', async () => {
		const before = (await attemptIdsOf(learner.id)).length;
		const { status, body } = await post(uploadData({ assignment: ASSIGNMENT, submissionKey: key(), flashPower: '3' }, pair));
		expect(status).toBe(400);
		expect(body.message).toContain('fraction of full power');
		expect((await attemptIdsOf(learner.id)).length).toBe(before);
	});

	test('a double-clicked submit (same key, twice at once) makes one attempt and answers both with it', async () => {
		const submissionKey = key();
		const before = (await attemptIdsOf(learner.id)).length;
		const [a, b] = await Promise.all([
			post(uploadData({ assignment: ASSIGNMENT, submissionKey }, pair)),
			post(uploadData({ assignment: ASSIGNMENT, submissionKey }, pair))
		]);
		expect([a.status, b.status].sort()).toEqual([200, 201]);
		expect(a.body.id).toBe(b.body.id);
		expect((await attemptIdsOf(learner.id)).length).toBe(before + 1);
		// the losing request's files were removed: only the winner's folder exists
		const folders = readdirSync(join(dataDir, 'attempts'));
		expect(folders).toContain(a.body.id);
		// and a third send with the same key, later, still finds it
		const again = await post(uploadData({ assignment: ASSIGNMENT, submissionKey }, pair));
		expect(again).toMatchObject({ status: 200, body: { id: a.body.id, duplicate: true } });
	});

	test('a missing frame, a wrong type and an empty file get a message each, and nothing is stored', async () => {
		const before = await attemptIdsOf(learner.id);
		const missing = await post(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, { reference: pair.reference }));
		expect(missing.status).toBe(422);
		expect(missing.body.frames).toEqual({ lit: 'The “lit” frame is missing. Add it and send again.' });

		const text = new Blob(['not a photo at all'], { type: 'image/jpeg' });
		const gif = new Blob([Buffer.from('GIF89a' + '\0'.repeat(20), 'latin1')], { type: 'image/gif' });
		const wrong = await post(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, { reference: text, lit: gif }));
		expect(wrong.status).toBe(422);
		expect(wrong.body.frames.reference).toMatch(/not a photo we can read/);
		expect(wrong.body.frames.lit).toMatch(/GIF files carry no camera settings/);

		const empty = await post(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, { reference: pair.reference, lit: new Blob([]) }));
		expect(empty.body.frames).toEqual({ lit: 'This file is empty. Please choose the photo again.' });
		expect(await attemptIdsOf(learner.id)).toEqual(before);
	});

	test('a frame over the size limit is refused while it streams in, with the frame and the limit in the message', async () => {
		const previous = process.env.STOPWISE_MAX_UPLOAD_MB;
		process.env.STOPWISE_MAX_UPLOAD_MB = String(pair.lit.length / 2 / 1024 / 1024);
		try {
			const { status, body } = await post(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, pair));
			expect(status).toBe(413);
			expect(body.message).toMatch(/^The “(reference|lit)” frame: This file is larger than the limit of \d+ [KM]B\./);
		} finally {
			if (previous === undefined) delete process.env.STOPWISE_MAX_UPLOAD_MB;
			else process.env.STOPWISE_MAX_UPLOAD_MB = previous;
		}
	});

	test('a body declared larger than any upload may be is refused before it is read', async () => {
		const { status, body } = await post(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, pair), learner, { 'content-length': String(2 ** 40) });
		expect(status).toBe(413);
		expect(body.error).toBe('too-large');
	});

	test('a storage failure half-way leaves no rows and no files', async () => {
		const real = fileStore();
		const keys: string[] = [];
		const failing: FileStore = {
			...real,
			put: async (k, d) => {
				keys.push(k);
				if (keys.length === 4) throw new Error('disk full');
				await real.put(k, d);
			}
		};
		useFileStore(failing);
		const before = await attemptIdsOf(learner.id);
		try {
			const { status, body } = await post(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, pair));
			expect(status).toBe(503);
			expect(body.message).toMatch(/nothing was kept/);
		} finally {
			useFileStore(real);
		}
		expect(keys).toHaveLength(4);
		const id = keys[0].split('/')[1];
		expect(existsSync(folderOf(id))).toBe(false);
		expect(await attemptIdsOf(learner.id)).toEqual(before);
	});

	test('a database failure after the files were written removes the files', async () => {
		const gone = await freshLearner();
		await enrol(gone.id);
		const cookies = await signedInCookies(gone.email);
		const real = fileStore();
		let written = '';
		// the learner's account is deleted while their upload is being stored: the insert then fails
		useFileStore({
			...real,
			put: async (k, d) => {
				written = k;
				await real.put(k, d);
				if (k.endsWith('1-thumb.webp')) await db.delete(users).where(eq(users.id, gone.id));
			}
		});
		try {
			const outcome = await throughHooks(multipartEvent('/api/v1/attempts', uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, pair), cookies), (e) => POST(e as never));
			const response = (outcome as { value: Response }).value;
			expect(response.status).toBe(503);
		} finally {
			useFileStore(real);
		}
		const id = written.split('/')[1];
		expect(id).toMatch(/^[0-9a-f-]{36}$/);
		expect(existsSync(folderOf(id))).toBe(false);
		expect(await db.query.attempts.findFirst({ where: eq(attempts.id, id) })).toBeUndefined();
	});

	test('a learner without enrolment, an unknown assignment and a form without a key are refused', async () => {
		const notEnrolled = await post(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, pair), outsider);
		expect(notEnrolled).toMatchObject({ status: 403, body: { error: 'not-enrolled' } });
		const unknown = await post(uploadData({ assignment: 'no-such-assignment', submissionKey: key() }, pair));
		expect(unknown).toMatchObject({ status: 404, body: { error: 'not-found' } });
		const noKey = await post(uploadData({ assignment: ASSIGNMENT }, pair));
		expect(noKey).toMatchObject({ status: 400, body: { error: 'bad-request' } });
		const badBox = await post(uploadData({ assignment: ASSIGNMENT, submissionKey: key(), subjectBox: '0,0,1,1' }, pair));
		expect(badBox.body.message).toMatch(/almost the whole frame/);
		const notMultipart = await post('just text');
		expect(notMultipart.status).toBe(400);
		expect(await attemptIdsOf(outsider.id)).toEqual([]);
	});
});
