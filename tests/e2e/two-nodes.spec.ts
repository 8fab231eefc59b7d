// Many nodes: two app processes and two grading workers on one database and one bucket, with no browser page. Frames
// of 20 attempts go up across both apps (the upload started on one node, its parts sent to the other, some parts cut
// in two across nodes, one frame larger than an S3 part), each attempt is graded exactly once and every file is in the
// bucket; a session, the sign-in throttle and the mentor's review queue work whichever node answers.
import { expect, test } from '@playwright/test';
import { HeadObjectCommand, ListObjectsCommand, S3Client } from '@aws-sdk/client-s3';
import { randomUUID } from 'node:crypto';
import { readdir } from 'node:fs/promises';
import { UPLOAD_PART_BYTES } from '../../src/lib/attempts/upload-parts';
import { padJpeg } from '../../src/lib/server/attempts/uploads/padded-jpeg';
import { makeAttemptFromUploads, sendFrame, type TusSender } from '../../src/lib/server/attempts/uploads/tus-http-client';
import { framePair } from './support/enrolled-learner';
import { COURSE, demoAccount, LESSON } from './support/screens';
import { startTwoNodes, type TwoNodes } from './support/two-nodes';

const ATTEMPTS = 20;
let cluster: TwoNodes;
let bucket: S3Client;

test.describe.configure({ mode: 'serial' });

test.beforeAll(async () => {
	test.setTimeout(120_000);
	cluster = await startTwoNodes();
	bucket = new S3Client({
		region: 'us-east-1',
		endpoint: cluster.s3.endpoint,
		forcePathStyle: true,
		credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED'
	});
});

test.afterAll(async () => {
	bucket?.destroy();
	await cluster?.stop();
});

/**
 * Sends a form action to one node as a script would (SvelteKit then answers in JSON: `{ type, status }`); the action's
 * status (303 for its redirect, 400 or 429 for a failure), and the session cookie when one was set.
 */
async function formAction(node: string, path: string, form: Record<string, string>, cookie?: string): Promise<{ status: number; cookie: string | null }> {
	const answer = await fetch(`${node}${path}`, {
		method: 'POST',
		headers: { origin: cluster.origin, 'content-type': 'application/x-www-form-urlencoded', ...(cookie ? { cookie } : {}) },
		body: new URLSearchParams(form),
		redirect: 'manual'
	});
	const body = (await answer.json()) as { status?: number };
	const set = answer.headers.getSetCookie().find((c) => !/max-age=0/i.test(c))?.split(';')[0] ?? null;
	return { status: body.status ?? answer.status, cookie: set };
}

const signIn = (node: string, email: string, password: string) => formAction(node, '/signin', { email, password });

async function signedIn(node: string, role: 'learner' | 'mentor'): Promise<TusSender> {
	const { email, password } = demoAccount(role);
	const { status, cookie } = await signIn(node, email, password);
	expect(status, `${role} signs in on ${node}`).toBe(303);
	return { cookie: cookie!, origin: cluster.origin };
}

const get = (node: string, path: string, sender?: TusSender) => fetch(`${node}${path}`, { headers: sender ? { cookie: sender.cookie } : {}, redirect: 'manual' });

/** Every key at the bucket's top level (uploads in transit live there; attempts and lesson files under their folders). */
async function topLevelKeys(): Promise<string[]> {
	const page = await bucket.send(new ListObjectsCommand({ Bucket: cluster.s3.bucket, Delimiter: '/' }));
	return (page.Contents ?? []).map((o) => o.Key!);
}

test('20 attempts uploaded across two app nodes are each graded exactly once by two workers, and every file is in the bucket', async () => {
	test.setTimeout(180_000);
	const [a, b] = cluster.nodes;
	const [{ id: learnerId }] = await cluster.sql<{ id: string }[]>`select id from users where email = ${demoAccount('learner').email}`;
	await cluster.sql`insert into enrolments (user_id, course_id, source) select ${learnerId}, id, 'admin' from courses where slug = ${COURSE} on conflict do nothing`;
	const learner = await signedIn(a, 'learner');
	const { reference, lit } = await framePair({ width: 600, height: 400 });
	const big = padJpeg(lit, UPLOAD_PART_BYTES + 1024 * 1024);

	/** Attempt i: started on one node, its parts on the other (three parts for every fourth), made on either. */
	async function send(i: number): Promise<{ id: string; lit: Buffer }> {
		const nodes = i % 2 === 0 ? [a, b] : [b, a];
		const submissionKey = randomUUID();
		const litBytes = i === 1 ? big : lit;
		for (const [frame, bytes] of [['reference', reference], ['lit', litBytes]] as const) {
			// a part far under S3's 5 MiB minimum waits in the bucket until the next part, sent to the other node
			const partBytes = i % 4 === 0 ? Math.ceil(bytes.length / 3) : undefined;
			await sendFrame(nodes, learner, { assignment: LESSON, frame, submissionKey, bytes, partBytes });
		}
		const id = await makeAttemptFromUploads(i % 3 === 0 ? a : b, learner, { assignment: LESSON, submissionKey });
		return { id, lit: litBytes };
	}
	const made: { id: string; lit: Buffer }[] = [];
	for (let i = 0; i < ATTEMPTS; i += 4) made.push(...(await Promise.all([i, i + 1, i + 2, i + 3].map(send))));
	const ids = made.map((m) => m.id);
	expect(new Set(ids).size).toBe(ATTEMPTS);

	// both workers take jobs from the one queue; wait until every attempt has left it
	await expect
		.poll(async () => (await cluster.sql<{ n: number }[]>`select count(*)::int as n from attempts where id = any(${ids}) and status in ('graded', 'error')`)[0].n, {
			timeout: 150_000,
			intervals: [250, 500, 1000]
		})
		.toBe(ATTEMPTS);
	const rows = await cluster.sql<{ id: string; status: string; grade_runs: number; frames: number; analysed: number }[]>`
		select a.id, a.status, a.grade_runs,
			(select count(*)::int from attempt_frames f where f.attempt_id = a.id) as frames,
			(select count(*)::int from attempt_frames f where f.attempt_id = a.id and f.analysis is not null) as analysed
		from attempts a where a.id = any(${ids})`;
	for (const row of rows) expect(row, row.id).toEqual({ id: row.id, status: 'graded', grade_runs: 1, frames: 2, analysed: 2 });

	// every stored file is in the bucket, whichever node made the attempt
	const keys = await cluster.sql<{ original_key: string; large_key: string; thumb_key: string }[]>`
		select original_key, large_key, thumb_key from attempt_frames where attempt_id = any(${ids})`;
	expect(keys).toHaveLength(2 * ATTEMPTS);
	for (const key of keys.flatMap((k) => [k.original_key, k.large_key, k.thumb_key])) {
		const head = await bucket.send(new HeadObjectCommand({ Bucket: cluster.s3.bucket, Key: key }));
		expect(head.ContentLength, key).toBeGreaterThan(0);
	}
	// the large frame, uploaded across both nodes, is served whole by either
	const bigAttempt = made.find((m) => m.lit === big)!;
	for (const node of [a, b]) {
		const original = await get(node, `/files/attempts/${bigAttempt.id}/lit/original`, learner);
		expect(original.status).toBe(200);
		expect(Buffer.from(await original.arrayBuffer()).equals(big)).toBe(true);
	}
	// nothing of the uploads is left: no rows, no upload in the bucket, nothing on either node's disk
	expect((await cluster.sql<{ n: number }[]>`select count(*)::int as n from frame_uploads where user_id = ${learnerId}`)[0].n).toBe(0);
	expect((await topLevelKeys()).filter((k) => /^[a-f0-9]{32}/.test(k))).toEqual([]);
	for (const dir of cluster.uploadDirs) expect((await readdir(dir).catch(() => [] as string[])).filter((n) => /^[a-f0-9]{32}/.test(n)), dir).toEqual([]);
});

test('a session started on one node works on the other, and signing out on either ends it everywhere', async () => {
	const [a, b] = cluster.nodes;
	const learner = await signedIn(a, 'learner');
	const me = await get(b, '/api/v1/me', learner);
	expect(me.status).toBe(200);
	expect((await me.json()).email).toBe(demoAccount('learner').email);

	expect((await formAction(b, '/signout', {}, learner.cookie)).status).toBe(303);
	expect((await get(a, '/api/v1/me', learner)).status).toBe(401);
	expect((await get(b, '/api/v1/me', learner)).status).toBe(401);
});

test('sign-in failures are counted across both nodes: after the sixth wrong password the account waits on either', async () => {
	const [a, b] = cluster.nodes;
	const { email } = demoAccount('author');
	// five free tries for an account (throttleRules.account), and the sixth failure sets the wait: spread over both nodes
	for (const node of [a, b, a, b, a, b]) expect((await signIn(node, email, 'not-the-password')).status).toBe(400);
	// now it waits on both nodes, even with the right password
	expect((await signIn(a, email, 'not-the-password')).status).toBe(429);
	expect((await signIn(b, email, demoAccount('author').password)).status).toBe(429);
});

test('the mentor’s review queue pages through the same attempts whichever node answers each page', async () => {
	const [a, b] = cluster.nodes;
	const mentor = await signedIn(b, 'mentor');
	const learnerAttempts = await cluster.sql<{ id: string }[]>`select a.id from attempts a join users u on u.id = a.user_id where u.email = ${demoAccount('learner').email}`;
	expect(learnerAttempts.length).toBeGreaterThanOrEqual(ATTEMPTS);

	const seen: string[] = [];
	let cursor = '';
	for (let page = 0; page < 50; page++) {
		const node = page % 2 === 0 ? a : b;
		const answer = await get(node, `/api/v1/review-queue?limit=7${cursor ? `&cursor=${encodeURIComponent(cursor)}` : ''}`, mentor);
		expect(answer.status).toBe(200);
		const body = (await answer.json()) as { attempts: { id: string }[]; nextCursor: string | null };
		seen.push(...body.attempts.map((r) => r.id));
		if (!body.nextCursor) break;
		cursor = body.nextCursor;
	}
	expect(new Set(seen).size).toBe(seen.length);
	for (const { id } of learnerAttempts) expect(seen).toContain(id);
	// and the queue page itself renders on both
	for (const node of [a, b]) expect((await get(node, '/mentor', mentor)).status).toBe(200);
});
