// Hostile and unlucky uploads: a frame too small to measure and a damaged photo are refused at upload, naming the
// minimum or the damage, and nothing of the attempt is stored; a harmless camera quirk still passes.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import sharp from 'sharp';
import { closeQueue, openQueue } from '$lib/server/attempts/queue';
import { MIN_FRAME_SIDE } from '$lib/server/attempts/frame-integrity';
import { makeFrame, REFERENCE_EXIF } from '$lib/server/analysis/test-frames';
import { POST } from '../../src/routes/api/v1/attempts/+server';
import { throughHooks } from './support/request-event';
import { freshLearner, removeFreshPeople, signedInCookies } from './support/people';
import { ASSIGNMENT, attemptIdsOf, enrol, key, multipartEvent, passingPair, removeAttempts, uploadData } from './support/attempts';

let learner: Awaited<ReturnType<typeof freshLearner>>;
let pair: { reference: Buffer; lit: Buffer };

async function post(files: Record<string, Buffer>) {
	const cookies = await signedInCookies(learner.email);
	const outcome = await throughHooks(multipartEvent('/api/v1/attempts', uploadData({ assignment: ASSIGNMENT, submissionKey: key() }, files), cookies), (e) => POST(e as never));
	if (outcome.kind !== 'value') throw new Error(`unexpected ${JSON.stringify(outcome)}`);
	return { status: outcome.value.status, body: await outcome.value.json() };
}

beforeAll(async () => {
	await openQueue();
	learner = await freshLearner();
	await enrol(learner.id);
	pair = await passingPair();
});
afterAll(async () => {
	await removeAttempts(await attemptIdsOf(learner.id));
	await removeFreshPeople();
	await closeQueue();
});

/** Cut the coded data short and close the file with an end marker, as an interrupted copy can leave it. */
function cutShort(jpeg: Buffer): Buffer {
	return Buffer.concat([jpeg.subarray(0, Math.floor(jpeg.length * 0.5)), Buffer.from([0xff, 0xd9])]);
}

describe('frames refused at upload', () => {
	test('an 8 × 8 JPEG is refused, stating the minimum; nothing is stored', async () => {
		const tiny = await makeFrame({ width: 8, height: 8, subject: { stops: 0 }, background: { stops: 0 }, exif: REFERENCE_EXIF });
		const { status, body } = await post({ reference: pair.reference, lit: tiny });
		expect(status).toBe(422);
		expect(body.frames.lit).toMatch(new RegExp(`only 8 × 8 pixels.*at least ${MIN_FRAME_SIDE} × ${MIN_FRAME_SIDE}`));
		expect(body.frames.reference).toBeUndefined();
		expect(await attemptIdsOf(learner.id)).toEqual([]);
	});

	test('a JPEG cut short (with an end marker) and one with zeroed data are refused as damaged, never graded', async () => {
		const zeroed = Buffer.from(pair.lit);
		zeroed.fill(0, Math.floor(zeroed.length * 0.4), Math.floor(zeroed.length * 0.7));
		for (const damaged of [cutShort(pair.lit), zeroed]) {
			const { status, body } = await post({ reference: pair.reference, lit: damaged });
			expect(status).toBe(422);
			expect(body.frames.lit).toMatch(/damaged or incomplete/);
		}
		expect(await attemptIdsOf(learner.id)).toEqual([]);
	});

	test('a frame exactly at the minimum, and one with extra bytes before its end marker (a camera quirk), are accepted', async () => {
		const small = await sharp(pair.lit).resize(MIN_FRAME_SIDE * 3, MIN_FRAME_SIDE, { fit: 'fill' }).jpeg().withExif({}).toBuffer();
		const end = pair.reference.lastIndexOf(Buffer.from([0xff, 0xd9]));
		const quirky = Buffer.concat([pair.reference.subarray(0, end), Buffer.from([0, 0, 0]), pair.reference.subarray(end)]);
		const { status, body } = await post({ reference: quirky, lit: small });
		expect(body.frames).toBeUndefined();
		expect(status).toBe(201);
	});
});
