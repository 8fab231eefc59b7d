// Benchmark: how much a 40 MB frame raises the built app's peak resident memory (Linux VmHWM, reset before each step),
// sent as the upload page sends it: resumable upload (tus) in parts of UPLOAD_PART_BYTES (8 MiB), then the attempt made from the frames.
// Goals: one 40 MB frame ≤ 64 MB, two at once ≤ 128 MB. The making of the attempt (the frame checks: decoding and
// display copies of a 24 MP pair, one padded to 40 MB) is printed beside them.
import { once } from 'node:events';
import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { db } from '../../src/lib/server/db/index';
import { createSessionFor, sessionCookieName } from '../../src/lib/server/auth';
import { findAssignment } from '../../src/lib/server/attempts/assignment';
import { attemptFolder } from '../../src/lib/server/attempts/keys';
import { padJpeg } from '../../src/lib/server/attempts/uploads/padded-jpeg';
import { makeAttemptFromUploads, sendFrame as sendFrameByParts } from '../../src/lib/server/attempts/uploads/tus-http-client';
import { fileStore } from '../../src/lib/server/storage/index';
import { UPLOAD_PART_BYTES } from '../../src/lib/attempts/upload-parts';
import { startBuiltApp, memoryOf, resetPeak } from './app-process';
import { enrolledBenchLearner } from './fixtures';
import { makeBenchPair } from './grading';
import type { Bench } from './timing';

const ASSIGNMENT = 'off-the-axis';
const MB = 1024 * 1024;
const FRAME_BYTES = 40 * MB;
const GOALS = { one: 64 * MB, two: 128 * MB } as const;

type Client = { base: string; cookie: string };

/** One frame as the upload page sends it, in parts of UPLOAD_PART_BYTES, to one app. */
function sendFrame(client: Client, frame: string, bytes: Buffer, submissionKey: string): Promise<void> {
	return sendFrameByParts([client.base], { cookie: client.cookie, origin: client.base }, { assignment: ASSIGNMENT, frame, submissionKey, bytes });
}

function makeAttempt(client: Client, submissionKey: string): Promise<string> {
	return makeAttemptFromUploads(client.base, { cookie: client.cookie, origin: client.base }, { assignment: ASSIGNMENT, submissionKey });
}

/** Peak rise of the app's resident memory over what it held before `step`. */
async function peakRise(pid: number, step: () => Promise<unknown>): Promise<number> {
	// let the last step's garbage go before the baseline
	await new Promise((r) => setTimeout(r, 300));
	const before = memoryOf(pid).rss;
	resetPeak(pid);
	await step();
	return memoryOf(pid).peak - before;
}

const mbText = (bytes: number) => `${(bytes / MB).toFixed(1)} MB`;

export const uploadMemoryBench: Bench = {
	name: 'upload memory: peak RSS of the built app for 40 MB frames by resumable upload',
	async run() {
		const assignment = await findAssignment(ASSIGNMENT);
		if (!assignment?.spec) throw new Error(`assignment ${ASSIGNMENT} is missing: was the demo seeded?`);
		const learners = [
			await enrolledBenchLearner('bench-memory-a', 'Bench uploader A (invented)', assignment.course.id),
			await enrolledBenchLearner('bench-memory-b', 'Bench uploader B (invented)', assignment.course.id)
		];
		const port = Number(process.env.STOPWISE_BENCH_APP_PORT ?? 4391);
		// the app as `npm start` runs it; grading waits in the queue (this measures the upload, not the grader)
		const app = await startBuiltApp(port, { BODY_SIZE_LIMIT: '16M', STOPWISE_INLINE_WORKER: '0' });
		const made: string[] = [];
		try {
			const base = `http://127.0.0.1:${port}`;
			const clients: Client[] = [];
			for (const id of learners) clients.push({ base, cookie: `${sessionCookieName}=${await createSessionFor(id)}` });
			const { reference, lit } = await makeBenchPair();
			const big = padJpeg(lit, FRAME_BYTES);
			const bigReference = padJpeg(reference, FRAME_BYTES);
			const pid = app.pid!;

			// warm-up: every module and pool the upload path uses is loaded before measuring
			const warm = randomUUID();
			await sendFrame(clients[0], 'reference', reference, warm);
			await sendFrame(clients[0], 'lit', lit, warm);
			made.push(await makeAttempt(clients[0], warm));

			const oneKey = randomUUID();
			const one = await peakRise(pid, () => sendFrame(clients[0], 'lit', big, oneKey));
			const twoKeys = [randomUUID(), randomUUID()];
			const two = await peakRise(pid, () => Promise.all([sendFrame(clients[0], 'lit', big, twoKeys[0]), sendFrame(clients[1], 'lit', big, twoKeys[1])]));
			await sendFrame(clients[0], 'reference', bigReference, oneKey);
			const attempt = await peakRise(pid, async () => made.push(await makeAttempt(clients[0], oneKey)));

			const ok = one <= GOALS.one && two <= GOALS.two;
			return {
				ok,
				lines: [
					`frame size ${mbText(FRAME_BYTES)}, sent in parts of ${mbText(UPLOAD_PART_BYTES)}; app resident before: ${mbText(memoryOf(pid).rss)}`,
					`one 40 MB frame:          peak +${mbText(one).padStart(9)}  (goal ≤ ${mbText(GOALS.one)}) ${one <= GOALS.one ? 'OK' : 'MISSED'}`,
					`two 40 MB frames at once: peak +${mbText(two).padStart(9)}  (goal ≤ ${mbText(GOALS.two)}) ${two <= GOALS.two ? 'OK' : 'MISSED'}`,
					`making the attempt from two 40 MB frames (checks, display copies, store): peak +${mbText(attempt)} (no goal: the frame checks' own cost)`
				]
			};
		} finally {
			app.kill();
			await once(app, 'exit');
			for (const id of made) await fileStore().deletePrefix(attemptFolder(id));
			for (const id of learners) await db.execute(sql`delete from users where id = ${id}`);
		}
	}
};
