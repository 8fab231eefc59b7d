// Who may read an Attempt's files and status: the learner who made it, mentors and admins; display copies carry no personal metadata.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import exifr from 'exifr';
import sharp from 'sharp';
import { closeQueue, GRADE_QUEUE, openQueue, queueGrading } from '$lib/server/attempts/queue';
import { submitAttempt } from '$lib/server/attempts/submit';
import { readUploadForm } from '$lib/server/attempts/upload-form';
import { startGradingWorker } from '$lib/server/attempts/worker';
import { GET as getFile } from '../../src/routes/files/attempts/[id]/[frame]/[variant]/+server';
import { GET as getStatus } from '../../src/routes/api/v1/attempts/[id]/+server';
import { makeEvent, throughHooks, type TestCookies } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { ASSIGNMENT, attemptIdsOf, enrol, key, passingPair, removeAttempts, uploadData } from './support/attempts';

let owner: Awaited<ReturnType<typeof freshLearner>>;
let other: Awaited<ReturnType<typeof freshLearner>>;
let attemptId: string;
let pair: { reference: Buffer; lit: Buffer };

async function fetchFile(cookies: TestCookies | undefined, frame: string, variant: string, id = attemptId) {
	const path = `/files/attempts/${id}/${encodeURIComponent(frame)}/${variant}`;
	const outcome = await throughHooks(makeEvent({ path, cookies, params: { id, frame, variant } }), (e) => getFile(e as never));
	return (outcome as { value: Response }).value;
}

async function status(cookies: TestCookies | undefined, query = '', id = attemptId) {
	const outcome = await throughHooks(makeEvent({ path: `/api/v1/attempts/${id}${query}`, cookies, params: { id } }), (e) => getStatus(e as never));
	return (outcome as { value: Response }).value;
}

beforeAll(async () => {
	await openQueue();
	owner = await freshLearner();
	other = await freshLearner();
	await enrol(owner.id);
	// frames carrying GPS, an owner name and a body serial number
	pair = await passingPair({ width: 600, height: 400 }, true);
	const form = readUploadForm(uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, pair));
	if (!form.ok) throw new Error(form.message);
	const made = await submitAttempt({ id: owner.id, roles: ['learner'] }, form.form);
	if (made.kind !== 'created') throw new Error(made.kind);
	attemptId = made.id;
	// graded later, by a worker, in the long-poll test
	await (await openQueue()).deleteJob(GRADE_QUEUE, attemptId);
});

afterAll(async () => {
	await removeAttempts(await attemptIdsOf(owner.id));
	await removeFreshPeople();
	await closeQueue();
});

describe('attempt files', () => {
	test('the owner, mentors and admins read every variant; other learners and authors get 404; strangers 401', async () => {
		const cases: [string, TestCookies | undefined, number][] = [
			['owner', await signedInCookies(owner.email), 200],
			['mentor', await signedInCookies(demoAccount('mentor').email), 200],
			['admin', await signedInCookies(demoAccount('admin').email), 200],
			['other learner', await signedInCookies(other.email), 404],
			['author', await signedInCookies(demoAccount('author').email), 404],
			['anonymous', undefined, 401]
		];
		for (const [who, cookies, expected] of cases) {
			for (const variant of ['original', 'large', 'thumb']) {
				const response = await fetchFile(cookies, 'lit', variant);
				expect(response.status, `${who} ${variant}`).toBe(expected);
				if (expected === 200) expect(response.headers.get('cache-control')).toBe('private, max-age=3600');
			}
		}
	});

	test('the original comes back byte for byte, as a download', async () => {
		const response = await fetchFile(await signedInCookies(owner.email), 'reference', 'original');
		expect(response.headers.get('content-type')).toBe('image/jpeg');
		expect(response.headers.get('content-disposition')).toBe('attachment; filename="reference-original.jpg"');
		expect(Buffer.from(await response.arrayBuffer()).equals(pair.reference)).toBe(true);
	});

	test('display copies carry no GPS, owner name or serial number, though the original does', async () => {
		const cookies = await signedInCookies(owner.email);
		const original = Buffer.from(await (await fetchFile(cookies, 'lit', 'original')).arrayBuffer());
		expect((await exifr.gps(original))?.latitude).toBeCloseTo(47.6, 1);
		// exifr cannot open WebP at all (it throws "Unknown file format"), so read the WebP's metadata with sharp and
		// hand exifr the Exif block; the same reader must see GPS in a WebP that does keep it, or it proves nothing
		const gpsInWebp = async (webp: Buffer) => {
			const meta = await sharp(webp).metadata();
			return meta.exif ? ((await exifr.gps(meta.exif.subarray(6))) ?? null) : null;
		};
		const leaky = await sharp(original).webp().keepExif().toBuffer();
		expect((await gpsInWebp(leaky))?.latitude).toBeCloseTo(47.6, 1);
		for (const variant of ['large', 'thumb']) {
			const response = await fetchFile(cookies, 'lit', variant);
			expect(response.headers.get('content-type')).toBe('image/webp');
			const copy = Buffer.from(await response.arrayBuffer());
			expect(await gpsInWebp(copy)).toBeNull();
			const meta = await sharp(copy).metadata();
			expect([meta.exif, meta.xmp, meta.iptc]).toEqual([undefined, undefined, undefined]);
			expect(copy.includes(Buffer.from('SN-0042-TEST'))).toBe(false);
			expect(copy.includes(Buffer.from('Jordan Example'))).toBe(false);
		}
	});

	test('unknown frames, variants and attempts are 404s, never errors', async () => {
		const cookies = await signedInCookies(owner.email);
		expect((await fetchFile(cookies, 'no-such-frame', 'large')).status).toBe(404);
		expect((await fetchFile(cookies, 'lit', 'secret')).status).toBe(404);
		expect((await fetchFile(cookies, 'lit', 'large', 'not-an-attempt')).status).toBe(404);
	});
});

describe('attempt status', () => {
	test('only the owner, mentors and admins see it', async () => {
		expect((await status(await signedInCookies(owner.email))).status).toBe(200);
		expect((await status(await signedInCookies(demoAccount('mentor').email))).status).toBe(200);
		expect((await status(await signedInCookies(other.email))).status).toBe(404);
		expect((await status(undefined)).status).toBe(401);
	});

	test('a long poll answers as soon as the worker has graded the attempt', async () => {
		const cookies = await signedInCookies(owner.email);
		const first = await (await status(cookies)).json();
		expect(first).toMatchObject({ id: attemptId, status: 'queued', verdict: null });
		const waiting = status(cookies, '?wait=20&known=queued');
		const worker = await startGradingWorker();
		await queueGrading(attemptId);
		try {
			// the first change seen is 'grading', then 'graded'
			let body = await (await waiting).json();
			if (body.status === 'grading') body = await (await status(cookies, '?wait=20&known=grading')).json();
			// a poll that was not woken would end after its 20 s still 'queued' (and past this test's time limit); how soon
			// the wake comes is a figure for `npm run bench` (upload to verdict), not a timed test
			expect(body).toMatchObject({ status: 'graded', verdict: 'pass' });
		} finally {
			await worker.stop();
		}
	});
});
