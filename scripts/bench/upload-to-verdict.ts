// Benchmark: from a finished upload of two 24 MP JPEGs to the verdict being available, against the grading time itself.
import { randomUUID } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import { db } from '../../src/lib/server/db/index';
import { attempts } from '../../src/lib/server/db/schema';
import { readFrame } from '../../src/lib/server/analysis/index';
import { grade, validateSpec } from '../../src/lib/server/grading/index';
import { findAssignment } from '../../src/lib/server/attempts/assignment';
import { readWhenChanged } from '../../src/lib/server/attempts/events';
import { attemptFolder } from '../../src/lib/server/attempts/keys';
import { closeQueue } from '../../src/lib/server/attempts/queue';
import { submitAttempt } from '../../src/lib/server/attempts/submit';
import { readUploadForm } from '../../src/lib/server/attempts/upload-form';
import { startGradingWorker } from '../../src/lib/server/attempts/worker';
import { fileStore } from '../../src/lib/server/storage/index';
import { makeBenchPair } from './grading';
import { enrolledBenchLearner } from './fixtures';
import { median, ms, type Bench } from './timing';

const ASSIGNMENT = 'off-the-axis';
const ROUNDS = 5;
const ALLOWANCE_MS = 500;

function form(reference: Buffer, lit: Buffer) {
	const data = new FormData();
	data.append('assignment', ASSIGNMENT);
	data.append('submissionKey', randomUUID());
	data.append('frame:reference', new Blob([new Uint8Array(reference)], { type: 'image/jpeg' }), 'reference.jpg');
	data.append('frame:lit', new Blob([new Uint8Array(lit)], { type: 'image/jpeg' }), 'lit.jpg');
	const read = readUploadForm(data);
	if (!read.ok) throw new Error(read.message);
	return read.form;
}

/** Waits the way the verdict page does: the status route's long poll, woken by the grader's NOTIFY. */
async function waitForVerdict(id: string): Promise<void> {
	const deadline = Date.now() + 60_000;
	let known = 'queued';
	while (Date.now() < deadline) {
		const row = await readWhenChanged(
			id,
			async () => (await db.query.attempts.findFirst({ where: eq(attempts.id, id), columns: { status: true } }))?.status ?? 'missing',
			(status) => status !== known,
			25_000
		);
		if (row === 'graded') return;
		if (row === 'error' || row === 'missing') throw new Error(`attempt ended ${row}`);
		known = row;
	}
	throw new Error('no verdict within a minute');
}

export const uploadToVerdictBench: Bench = {
	name: 'upload to verdict (two 24 MP JPEGs, in-app worker)',
	async run() {
		const assignment = await findAssignment(ASSIGNMENT);
		if (!assignment?.spec) throw new Error(`assignment ${ASSIGNMENT} is missing: was the demo seeded?`);
		const userId = await enrolledBenchLearner('bench-uploader', 'Bench uploader (invented)', assignment.course.id);
		const worker = await startGradingWorker();
		const made: string[] = [];
		try {
			const { reference, lit } = await makeBenchPair();
			const spec = validateSpec(assignment.spec);
			if (!spec.ok) throw new Error('spec');
			const uploadMs: number[] = [];
			const toVerdictMs: number[] = [];
			const gradingMs: number[] = [];
			for (let round = 0; round < ROUNDS + 1; round++) {
				// grading alone, as the job does it: both frames read, then graded
				let start = performance.now();
				grade(spec.spec, { reference: await readFrame(reference), lit: await readFrame(lit) });
				const graded = performance.now() - start;

				start = performance.now();
				const result = await submitAttempt({ id: userId, roles: ['learner'] }, form(reference, lit));
				const uploaded = performance.now();
				if (result.kind !== 'created') throw new Error(`upload ${result.kind}`);
				made.push(result.id);
				await waitForVerdict(result.id);
				const available = performance.now();
				// the first round warms sharp, the pools and the worker
				if (round > 0) {
					gradingMs.push(graded);
					uploadMs.push(uploaded - start);
					toVerdictMs.push(available - uploaded);
				}
			}
			const gradingTime = median(gradingMs);
			const latency = median(toVerdictMs);
			const ok = latency <= gradingTime + ALLOWANCE_MS;
			return {
				ok,
				lines: [
					`upload handling (display copies, store, rows, job): median ${ms(median(uploadMs))}`,
					`grading time (readFrame × 2 + grade):                 median ${ms(gradingTime)}`,
					`upload finished → verdict available:                  median ${ms(latency)} (worst ${ms(Math.max(...toVerdictMs))})`,
					`overhead ${ms(latency - gradingTime)} over grading (target ≤ ${ALLOWANCE_MS} ms) ${ok ? 'OK' : 'MISSED'}`
				]
			};
		} finally {
			await worker.stop();
			await closeQueue();
			for (const id of made) await fileStore().deletePrefix(attemptFolder(id));
			await db.execute(sql`delete from users where id = ${userId}`);
		}
	}
};
