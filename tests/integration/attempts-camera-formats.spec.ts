// Uploading phones' HEIC frames and raw (DNG) frames: stored with their own type, shown, graded with pixels measured; damaged ones refused whole.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { attemptFrames, attempts } from '$lib/server/db/schema';
import { fileStore } from '$lib/server/storage';
import { closeQueue, openQueue } from '$lib/server/attempts/queue';
import { gradeAttempt } from '$lib/server/attempts/grade-job';
import { makeDng } from '$lib/server/analysis/test-dng';
import { makeHeic } from '$lib/server/analysis/test-heic';
import { REFERENCE_EXIF, type TestFrameSpec } from '$lib/server/analysis/test-frames';
import { POST } from '../../src/routes/api/v1/attempts/+server';
import { throughHooks } from './support/request-event';
import { freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { ASSIGNMENT, attemptIdsOf, enrol, key, multipartEvent, removeAttempts } from './support/attempts';

type Learner = Awaited<ReturnType<typeof freshLearner>>;
let learner: Learner;

const FLASH_FIRED = 0x19; // CIPA DC-008: fired, auto mode

/** The passing off-the-axis pair of support/attempts.ts (lit log2(1500/500) = 1.58 stops under, APEX), in another format. */
async function pairAs(make: (spec: TestFrameSpec) => Promise<Buffer> | Buffer) {
	const drop = Math.log2(1500 / 500);
	const size = { width: 600, height: 400 };
	return {
		reference: await make({ ...size, subject: { stops: 0 }, background: { stops: 0.5 }, exif: { ...REFERENCE_EXIF } }),
		lit: await make({ ...size, subject: { stops: 0 }, background: { stops: 0.5 - drop }, exif: { ...REFERENCE_EXIF, exposureTime: 1 / 1500, flash: FLASH_FIRED } })
	};
}

function formData(files: Record<string, Buffer>, filename: (name: string) => string, type: string): FormData {
	const data = new FormData();
	data.append('assignment', ASSIGNMENT);
	data.append('submissionKey', key());
	for (const [name, bytes] of Object.entries(files)) data.append(`frame:${name}`, new Blob([new Uint8Array(bytes)], { type }), filename(name));
	return data;
}

async function post(data: FormData) {
	const cookies = await signedInCookies(learner.email);
	const outcome = await throughHooks(multipartEvent('/api/v1/attempts', data, cookies), (e) => POST(e as never));
	if (outcome.kind !== 'value') throw new Error(`unexpected ${outcome.kind}`);
	return { status: outcome.value.status, body: await outcome.value.json() };
}

beforeAll(async () => {
	await openQueue();
	learner = await freshLearner();
	await enrol(learner.id);
});

afterAll(async () => {
	await removeAttempts(await attemptIdsOf(learner.id));
	await removeFreshPeople();
	await closeQueue();
});

describe('HEIC and raw uploads', () => {
	test.each([
		['HEIC', () => pairAs(makeHeic), (n: string) => `IMG_${n}.HEIC`, 'image/heic', 'image/heic', /-original\.heic$/],
		['DNG', () => pairAs(makeDng), (n: string) => `${n}.DNG`, '', 'image/x-adobe-dng', /-original\.dng$/]
	])('a %s pair is stored as sent, shown as WebP, and graded with its pixels measured', async (_, make, filename, sentType, mime, extension) => {
		const pair = await make();
		const { status, body } = await post(formData(pair, filename, sentType));
		expect(status).toBe(201);
		const frames = await db.select().from(attemptFrames).where(eq(attemptFrames.attemptId, body.id));
		expect(frames).toHaveLength(2);
		for (const f of frames) {
			expect(f.mime).toBe(mime);
			expect(f.originalKey).toMatch(extension);
			expect((await fileStore().get(f.originalKey))?.equals(pair[f.name as 'reference' | 'lit'])).toBe(true);
			expect((await fileStore().get(f.largeKey))?.subarray(8, 12).toString()).toBe('WEBP');
		}
		expect(await gradeAttempt(body.id)).toBe('graded');
		const row = await db.query.attempts.findFirst({ where: eq(attempts.id, body.id) });
		expect(row?.status).toBe('graded');
		expect(row?.autoVerdict).toBe('pass');
	});

	test('a damaged DNG and a cut-short HEIC are refused with messages naming the format, and nothing is stored', async () => {
		const before = await attemptIdsOf(learner.id);
		const heic = await makeHeic({ subject: { stops: 0 }, background: { stops: 0 }, exif: REFERENCE_EXIF });
		const files = {
			reference: makeDng({ subject: { stops: 0 }, background: { stops: 0 }, exif: REFERENCE_EXIF, truncate: true }),
			lit: heic.subarray(0, Math.floor(heic.length * 0.6))
		};
		const { status, body } = await post(formData(files, (n) => `${n}.raw`, ''));
		expect(status).toBe(422);
		expect(body.frames.reference).toMatch(/raw \(DNG\) file/);
		expect(body.frames.lit).toMatch(/HEIC/);
		expect(await attemptIdsOf(learner.id)).toEqual(before);
	});
});
