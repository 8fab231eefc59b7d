// Lesson clips against the real PostgreSQL and ffmpeg: added by an author, the video sent by resumable upload, transcoded
// by the pg-boss job with progress, played in byte ranges behind the lesson's access rule; failures leave nothing behind.
import { existsSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { lessonClips, lessons } from '$lib/server/db/schema';
import { fileStore, useFileStore } from '$lib/server/storage';
import type { FileStore } from '$lib/server/storage/store';
import { closeQueue, openQueue } from '$lib/server/attempts/queue';
import { startGradingWorker, type RunningWorker } from '$lib/server/attempts/worker';
import { uploadDir } from '$lib/server/attempts/uploads/folder';
import { sweepUploads } from '$lib/server/attempts/uploads/sweep';
import { clipKey } from '$lib/server/clips/keys';
import { transcodeClip } from '$lib/server/clips/transcode-job';
import { createClip, findClip } from '$lib/server/clips/records';
import { makeTestVideo } from '$lib/server/clips/test-video';
import { DEMO_CLIP, seedDemoClip } from '$lib/server/clips/demo';
import { POST as createUpload } from '../../src/routes/api/v1/uploads/+server';
import { PATCH } from '../../src/routes/api/v1/uploads/[id]/+server';
import { POST as addClip } from '../../src/routes/api/v1/author/clips/+server';
import { GET as clipState, DELETE as removeClip } from '../../src/routes/api/v1/author/clips/[id]/+server';
import { GET as clipFile } from '../../src/routes/api/v1/clips/[id]/[file]/+server';
import { makeEvent, throughHooks, type TestCookies } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { enrol, LESSON } from './support/attempts';

const CAPTIONS = 'WEBVTT\n\n00:00.000 --> 00:01.500\nA test pattern, made by ffmpeg.\n';
const b64 = (s: string) => Buffer.from(s).toString('base64');

let author: TestCookies;
let enrolled: TestCookies;
let unpaid: TestCookies;
let lessonId: number;
let worker: RunningWorker;
const made: string[] = [];

async function call(handler: (e: never) => Response | Promise<Response>, init: { method: string; path: string; routeId: string; params?: Record<string, string>; cookies?: TestCookies; headers?: Record<string, string>; body?: BodyInit }) {
	const event = makeEvent({ method: init.method, path: init.path, cookies: init.cookies, routeId: init.routeId, params: init.params });
	const url = new URL(init.path, event.url.origin);
	(event as { request: Request }).request = new Request(url, { method: init.method, body: init.body, headers: { origin: url.origin, ...init.headers } });
	const outcome = await throughHooks(event, (e) => handler(e as never));
	if (outcome.kind !== 'value') throw new Error(`unexpected ${JSON.stringify(outcome)}`);
	return outcome.value as Response;
}

async function add(name: string, captions = CAPTIONS) {
	const response = await call(addClip, {
		method: 'POST',
		path: '/api/v1/author/clips',
		routeId: '/api/v1/author/clips',
		cookies: author,
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify({ lesson: lessonId, name, title: `Test clip ${name}`, captions })
	});
	const body = await response.json();
	if (response.status === 201) made.push(body.id);
	return { status: response.status, body };
}

/** Sends a video by the tus endpoint in parts, as the editor does. */
async function upload(clipId: string, bytes: Buffer, cookies = author) {
	const created = await call(createUpload, {
		method: 'POST',
		path: '/api/v1/uploads',
		routeId: '/api/v1/uploads',
		cookies,
		headers: { 'tus-resumable': '1.0.0', 'upload-length': String(bytes.length), 'upload-metadata': `kind ${b64('clip')},clip ${b64(clipId)},filename ${b64('clip.mp4')}` }
	});
	if (created.status !== 201) return { status: created.status, body: await created.json() };
	const location = created.headers.get('location')!;
	const id = location.split('/').pop()!;
	for (let offset = 0; offset < bytes.length; ) {
		const part = await call(PATCH, {
			method: 'PATCH',
			path: location,
			routeId: '/api/v1/uploads/[id]',
			params: { id },
			cookies,
			headers: { 'tus-resumable': '1.0.0', 'upload-offset': String(offset), 'content-type': 'application/offset+octet-stream' },
			body: new Uint8Array(bytes.subarray(offset, offset + 64 * 1024))
		});
		expect(part.status).toBe(204);
		offset = Number(part.headers.get('upload-offset'));
	}
	return { status: 201, uploadId: id };
}

async function waitFor(clipId: string, until: (status: string) => boolean) {
	const seen: number[] = [];
	for (let i = 0; i < 600; i++) {
		const answer = await call(clipState, { method: 'GET', path: `/api/v1/author/clips/${clipId}`, routeId: '/api/v1/author/clips/[id]', params: { id: clipId }, cookies: author });
		const state = await answer.json();
		seen.push(state.progress);
		if (until(state.status)) return { state, seen };
		await new Promise((r) => setTimeout(r, 100));
	}
	throw new Error(`clip ${clipId} never settled`);
}

const fetchFile = (clipId: string, file: string, cookies?: TestCookies, range?: string) =>
	call(clipFile, { method: 'GET', path: `/api/v1/clips/${clipId}/${file}`, routeId: '/api/v1/clips/[id]/[file]', params: { id: clipId, file }, cookies, headers: range ? { range } : {} });

async function storedKeys(clipId: string) {
	const keys = ['720.mp4', '360.mp4', 'poster.jpg'].map((f) => clipKey(clipId, f));
	const found = await Promise.all(keys.map((k) => fileStore().get(k)));
	return keys.filter((_, i) => found[i] !== null);
}

beforeAll(async () => {
	await openQueue();
	const [lesson] = await db.select({ id: lessons.id, free: lessons.freePreview }).from(lessons).where(eq(lessons.slug, LESSON)).limit(1);
	expect(lesson.free).toBe(false);
	lessonId = lesson.id;
	author = await signedInCookies(demoAccount('author').email);
	const paid = await freshLearner();
	await enrol(paid.id);
	enrolled = await signedInCookies(paid.email);
	unpaid = await signedInCookies((await freshLearner()).email);
	worker = await startGradingWorker();
}, 60_000);

afterAll(async () => {
	await worker?.stop();
	for (const id of made) {
		await db.delete(lessonClips).where(eq(lessonClips.id, id));
		await fileStore().deletePrefix(`clips/${id}`);
	}
	await removeFreshPeople();
	await closeQueue();
});

describe('lesson clips', () => {
	test('an author adds a clip, uploads its video in parts; the job makes two renditions and a poster with progress on the way', async () => {
		const source = await makeTestVideo({ seconds: 3, width: 1280, height: 720 });
		const added = await add(`test-${Date.now()}`);
		expect(added.status).toBe(201);
		const sent = await upload(added.body.id, source);
		expect(sent.status).toBe(201);
		const { state, seen } = await waitFor(added.body.id, (s) => s === 'ready' || s === 'failed');
		expect(state).toMatchObject({ status: 'ready', progress: 1, error: null });
		expect(state.sources.map((s: { height: number }) => s.height)).toEqual([720, 360]);
		expect(state.sources[1].width).toBe(640);
		// progress only goes forward, from ffmpeg's -progress, and ends at 1
		expect(seen.every((p, i) => i === 0 || p >= seen[i - 1])).toBe(true);
		expect(state.durationSeconds).toBeCloseTo(3, 0);
		expect(await storedKeys(added.body.id)).toHaveLength(3);
		// the source is gone once used
		expect(existsSync(join(uploadDir(), sent.uploadId!))).toBe(false);
		expect((await findClip(added.body.id))?.uploadId).toBeNull();
	}, 120_000);

	test('the clip plays in byte ranges for an enrolled learner, and gives nothing to an unpaid learner or a visitor', async () => {
		const clip = (await db.select().from(lessonClips).where(eq(lessonClips.id, made[0])))[0];
		const size = clip.renditions[0].bytes;
		const whole = await fetchFile(clip.id, '720.mp4', enrolled);
		expect(whole.status).toBe(200);
		expect(whole.headers.get('accept-ranges')).toBe('bytes');
		expect(whole.headers.get('cache-control')).toMatch(/private/);
		const all = Buffer.from(await whole.arrayBuffer());
		expect(all.length).toBe(size);
		// an MP4 with its index first (+faststart): the moov box comes before the media data (ISO/IEC 14496-12 box layout)
		expect(all.indexOf('moov')).toBeLessThan(all.indexOf('mdat'));

		const part = await fetchFile(clip.id, '720.mp4', enrolled, 'bytes=100-1099');
		expect(part.status).toBe(206);
		expect(part.headers.get('content-range')).toBe(`bytes 100-1099/${size}`);
		expect(Buffer.from(await part.arrayBuffer()).equals(all.subarray(100, 1100))).toBe(true);
		const past = await fetchFile(clip.id, '720.mp4', enrolled, `bytes=${size}-`);
		expect(past.status).toBe(416);
		expect(past.headers.get('content-range')).toBe(`bytes */${size}`);

		const captions = await fetchFile(clip.id, 'captions.vtt', enrolled);
		expect(captions.headers.get('content-type')).toMatch(/^text\/vtt/);
		expect(await captions.text()).toBe(CAPTIONS);
		expect((await fetchFile(clip.id, 'poster.jpg', enrolled)).headers.get('content-type')).toBe('image/jpeg');

		for (const file of ['720.mp4', '360.mp4', 'poster.jpg', 'captions.vtt']) {
			expect((await fetchFile(clip.id, file, unpaid)).status, file).toBe(403);
			expect((await fetchFile(clip.id, file)).status, file).toBe(401);
		}
		expect((await fetchFile(clip.id, '../720.mp4', enrolled)).status).toBe(404);
	});

	test('a file ffmpeg cannot read fails with a clear message and leaves nothing: no renditions, no upload bytes, no work folder', async () => {
		const added = await add(`broken-${Date.now()}`);
		const sent = await upload(added.body.id, Buffer.concat([Buffer.from('\x00\x00\x00\x18ftypmp42'), Buffer.alloc(40_000, 7)]));
		const { state } = await waitFor(added.body.id, (s) => s === 'ready' || s === 'failed');
		expect(state.status).toBe('failed');
		expect(state.error).toMatch(/could not be read as video/);
		expect(await storedKeys(added.body.id)).toEqual([]);
		expect(existsSync(join(uploadDir(), sent.uploadId!))).toBe(false);
		// a learner never sees a failed clip
		expect((await fetchFile(added.body.id, 'captions.vtt', enrolled)).status).toBe(404);
	}, 60_000);

	test('a clip over the duration limit fails before any transcoding, and a failed store write leaves no files', async () => {
		const id = (await createClip({ lessonId, name: `long-${Date.now()}`, title: 'Too long', captions: CAPTIONS, createdBy: null }))!;
		made.push(id);
		const uploadId = 'a'.repeat(16) + Date.now().toString(16).padStart(16, '0').slice(-16);
		await writeFile(join(uploadDir(), uploadId), await makeTestVideo({ seconds: 3 }));
		await db.update(lessonClips).set({ uploadId, status: 'queued' }).where(eq(lessonClips.id, id));
		expect(await transcodeClip(id, { limits: { bytes: 2 ** 30, seconds: 2, longSide: 3840 } })).toBe('failed');
		const row = await findClip(id);
		expect(row?.error).toMatch(/runs 3 seconds; the limit is 2 seconds/);
		expect(row?.renditions).toEqual([]);
		expect(await storedKeys(id)).toEqual([]);
		expect(existsSync(join(uploadDir(), uploadId))).toBe(false);

		// the store refuses the second file: the first one written is removed again
		const second = (await createClip({ lessonId, name: `store-${Date.now()}`, title: 'Store fails', captions: CAPTIONS, createdBy: null }))!;
		made.push(second);
		const secondUpload = 'b'.repeat(16) + Date.now().toString(16).padStart(16, '0').slice(-16);
		await writeFile(join(uploadDir(), secondUpload), await makeTestVideo({ seconds: 1 }));
		await db.update(lessonClips).set({ uploadId: secondUpload, status: 'queued' }).where(eq(lessonClips.id, second));
		const real = fileStore();
		let puts = 0;
		const failing: FileStore = {
			...real,
			put: async (k, d) => {
				if (++puts === 2) throw new Error('disk full');
				await real.put(k, d);
			}
		};
		useFileStore(failing);
		try {
			expect(await transcodeClip(second)).toBe('failed');
		} finally {
			useFileStore(real);
		}
		expect(puts).toBe(2);
		expect((await findClip(second))?.error).toMatch(/could not be processed just now/);
		expect(await storedKeys(second)).toEqual([]);
		expect(existsSync(join(uploadDir(), secondUpload))).toBe(false);
	}, 60_000);

	test('the author API refuses bad captions and a taken name; learners cannot add or upload clips', async () => {
		expect(await add('x', 'not captions')).toMatchObject({ status: 400, body: { field: 'captions', message: expect.stringMatching(/WEBVTT/) } });
		const name = `taken-${Date.now()}`;
		expect((await add(name)).status).toBe(201);
		expect(await add(name)).toMatchObject({ status: 409, body: { field: 'name' } });
		const learnerAdd = await call(addClip, { method: 'POST', path: '/api/v1/author/clips', routeId: '/api/v1/author/clips', cookies: enrolled, headers: { 'content-type': 'application/json' }, body: '{}' });
		expect(learnerAdd.status).toBe(403);
		expect((await upload(made.at(-1)!, Buffer.alloc(100), enrolled)).status).toBe(403);
	});

	test('deleting a clip removes its row and files; the sweep removes a clip folder no clip owns', async () => {
		const id = made[0];
		expect(await storedKeys(id)).toHaveLength(3);
		const removed = await call(removeClip, { method: 'DELETE', path: `/api/v1/author/clips/${id}`, routeId: '/api/v1/author/clips/[id]', params: { id }, cookies: author });
		expect(removed.status).toBe(204);
		expect(await findClip(id)).toBeNull();
		expect(await storedKeys(id)).toEqual([]);

		const orphan = '00000000-0000-4000-8000-00000000c11b';
		await fileStore().put(clipKey(orphan, '720.mp4'), Buffer.from('left by a job whose clip was deleted'));
		const report = await sweepUploads(new Date(Date.now() + 2 * 60 * 60 * 1000));
		expect(report.clips).toBeGreaterThanOrEqual(1);
		expect(await fileStore().get(clipKey(orphan, '720.mp4'))).toBeNull();
	}, 60_000);

	test('the demo clip is seeded once: seeding again keeps it, ready in its lesson with both renditions', async () => {
		expect(['made', 'kept']).toContain(await seedDemoClip(db));
		expect(await seedDemoClip(db)).toBe('kept');
		const [demo] = await db.select().from(lessonClips).where(eq(lessonClips.name, DEMO_CLIP.name));
		expect(demo).toMatchObject({ status: 'ready' });
		expect(demo.renditions.map((r) => r.height)).toEqual([540, 360]);
		expect(await storedKeys(demo.id)).toHaveLength(3);
	}, 120_000);
});
