// Benchmark: how much a 40 MB frame raises the built app's peak resident memory (Linux VmHWM, reset before each step),
// sent as the upload page sends it: resumable upload (tus) in 4 MiB parts, then the attempt made from the frames.
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

/** A minimal tus client, as the upload page's: create, then PATCH parts of UPLOAD_PART_BYTES. */
async function sendFrame(client: Client, frame: string, bytes: Buffer, submissionKey: string): Promise<void> {
	const b64 = (s: string) => Buffer.from(s).toString('base64');
	const headers = { cookie: client.cookie, origin: client.base, 'tus-resumable': '1.0.0' };
	const created = await fetch(`${client.base}/api/v1/uploads`, {
		method: 'POST',
		headers: { ...headers, 'upload-length': String(bytes.length), 'upload-metadata': `assignment ${b64(ASSIGNMENT)},frame ${b64(frame)},submissionKey ${b64(submissionKey)}` }
	});
	if (created.status !== 201) throw new Error(`upload start answered ${created.status}: ${await created.text()}`);
	const url = new URL(created.headers.get('location')!, client.base).href;
	for (let offset = 0; offset < bytes.length; ) {
		const part = bytes.subarray(offset, offset + UPLOAD_PART_BYTES);
		const sent = await fetch(url, {
			method: 'PATCH',
			headers: { ...headers, 'upload-offset': String(offset), 'content-type': 'application/offset+octet-stream' },
			body: new Uint8Array(part)
		});
		if (sent.status !== 204) throw new Error(`part at ${offset} answered ${sent.status}: ${await sent.text()}`);
		offset = Number(sent.headers.get('upload-offset'));
	}
}

async function makeAttempt(client: Client, submissionKey: string): Promise<string> {
	const form = new FormData();
	form.append('assignment', ASSIGNMENT);
	form.append('submissionKey', submissionKey);
	const answer = await fetch(`${client.base}/api/v1/attempts/from-uploads`, { method: 'POST', headers: { cookie: client.cookie, origin: client.base, accept: 'application/json' }, body: form });
	const body = (await answer.json()) as { id?: string; message?: string };
	if (answer.status !== 201 || !body.id) throw new Error(`making the attempt answered ${answer.status}: ${body.message ?? ''}`);
	return body.id;
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
