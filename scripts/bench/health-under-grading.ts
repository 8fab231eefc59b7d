// Benchmark: does grading inside the web process (the default in-app worker) stall other requests? This process
// serves /api/health and runs the grading worker, as the app does; a separate client process measures the health
// route's latency at idle and while a batch of pairs is graded, and the p99 of each is printed side by side.
import { spawn } from 'node:child_process';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { createServer } from 'node:http';
import { once } from 'node:events';
import { randomUUID } from 'node:crypto';
import { eq, inArray, sql } from 'drizzle-orm';
import { db } from '../../src/lib/server/db/index';
import { attempts } from '../../src/lib/server/db/schema';
import { findAssignment } from '../../src/lib/server/attempts/assignment';
import { attemptFolder } from '../../src/lib/server/attempts/keys';
import { closeQueue } from '../../src/lib/server/attempts/queue';
import { submitAttempt } from '../../src/lib/server/attempts/submit';
import { readUploadForm } from '../../src/lib/server/attempts/upload-form';
import { startGradingWorker } from '../../src/lib/server/attempts/worker';
import { fileStore } from '../../src/lib/server/storage/index';
import { checkHealth } from '../../src/lib/server/health';
import { makeBenchPair } from './grading';
import { enrolledBenchLearner } from './fixtures';
import { ms, type Bench } from './timing';

const ASSIGNMENT = 'off-the-axis';
const PAIRS = 6;
const IDLE_MS = 4000;
/** p99 while grading may be this many times the idle p99, plus a floor for timer noise on a shared machine. */
const TARGET_RATIO = 3;
const FLOOR_MS = 50;

/** The client: GETs the URL every 20 ms until its stdin closes, then prints every latency (ms) as JSON. */
const CLIENT = `
const url = process.argv[1];
const samples = [];
let running = true;
process.stdin.on('end', () => { running = false; });
process.stdin.resume();
(async () => {
	while (running) {
		const t0 = performance.now();
		try { const r = await fetch(url); await r.arrayBuffer(); } catch { samples.push(10000); continue; }
		samples.push(performance.now() - t0);
		await new Promise((r) => setTimeout(r, 20));
	}
	process.stdout.write(JSON.stringify(samples));
})();
`;

function p99(values: number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	return sorted[Math.min(sorted.length - 1, Math.floor(sorted.length * 0.99))];
}

/**
 * Latencies seen by a client process while `during` runs, and this process's event-loop delay p99 meanwhile (ms):
 * the loop delay is what grading itself holds requests up by, less blurred by other load on a shared machine.
 */
async function measure(url: string, during: () => Promise<void>): Promise<{ samples: number[]; loopP99: number }> {
	const loop = monitorEventLoopDelay({ resolution: 5 });
	const child = spawn(process.execPath, ['-e', CLIENT, url], { stdio: ['pipe', 'pipe', 'inherit'] });
	let out = '';
	child.stdout.on('data', (c: Buffer) => (out += c.toString()));
	loop.enable();
	await during();
	loop.disable();
	child.stdin.end();
	await once(child, 'exit');
	return { samples: JSON.parse(out) as number[], loopP99: loop.percentile(99) / 1e6 };
}

export const healthUnderGradingBench: Bench = {
	name: `/api/health latency while the in-app worker grades ${PAIRS} pairs of 24 MP JPEGs`,
	async run() {
		const assignment = await findAssignment(ASSIGNMENT);
		if (!assignment?.spec) throw new Error(`assignment ${ASSIGNMENT} is missing: was the demo seeded?`);
		// the route's own work (the route module needs Kit's $app modules, which only a Kit build provides)
		const server = createServer(async (_req, res) => {
			const health = await checkHealth();
			res.writeHead(health.ok ? 200 : 503, { 'content-type': 'application/json' }).end(JSON.stringify(health));
		});
		server.listen(0, '127.0.0.1');
		await once(server, 'listening');
		const address = server.address();
		if (!address || typeof address === 'string') throw new Error('no port');
		const url = `http://127.0.0.1:${address.port}/api/health`;

		const userId = await enrolledBenchLearner('bench-health', 'Bench learner (invented)', assignment.course.id);
		const worker = await startGradingWorker();
		const made: string[] = [];
		try {
			const { reference, lit } = await makeBenchPair();
			const idle = await measure(url, () => new Promise((r) => setTimeout(r, IDLE_MS)));
			// the uploads are made with the worker off, so the measurement covers the grading alone
			await worker.stop();
			for (let i = 0; i < PAIRS; i++) {
				const data = new FormData();
				data.append('assignment', ASSIGNMENT);
				data.append('submissionKey', randomUUID());
				data.append('frame:reference', new Blob([new Uint8Array(reference)], { type: 'image/jpeg' }), 'reference.jpg');
				data.append('frame:lit', new Blob([new Uint8Array(lit)], { type: 'image/jpeg' }), 'lit.jpg');
				const form = readUploadForm(data);
				if (!form.ok) throw new Error(form.message);
				const result = await submitAttempt({ id: userId, roles: ['learner'] }, form.form);
				if (result.kind !== 'created') throw new Error(`upload ${result.kind}`);
				made.push(result.id);
			}
			const grading = await measure(url, async () => {
				const again = await startGradingWorker();
				try {
					const deadline = Date.now() + 5 * 60_000;
					for (;;) {
						const rows = await db.select({ status: attempts.status }).from(attempts).where(inArray(attempts.id, made));
						if (rows.every((r) => r.status === 'graded' || r.status === 'error')) break;
						if (Date.now() > deadline) throw new Error('grading took over five minutes');
						await new Promise((r) => setTimeout(r, 100));
					}
				} finally {
					await again.stop();
				}
			});
			const idleP99 = p99(idle.samples);
			const busyP99 = p99(grading.samples);
			const allowed = idleP99 * TARGET_RATIO + FLOOR_MS;
			const ok = busyP99 <= allowed;
			return {
				ok,
				lines: [
					`idle:    ${idle.samples.length} requests, p99 ${ms(idleP99)}, worst ${ms(Math.max(...idle.samples))}; event-loop delay p99 ${ms(idle.loopP99)}`,
					`grading: ${grading.samples.length} requests, p99 ${ms(busyP99)}, worst ${ms(Math.max(...grading.samples))}; event-loop delay p99 ${ms(grading.loopP99)}`,
					`p99 while grading ${(busyP99 / idleP99).toFixed(1)}× idle (target ≤ ${TARGET_RATIO}× idle + ${FLOOR_MS} ms = ${ms(allowed)}) ${ok ? 'OK' : 'MISSED'}`
				]
			};
		} finally {
			await worker.stop().catch(() => {});
			server.close();
			await closeQueue();
			for (const id of made) await fileStore().deletePrefix(attemptFolder(id));
			await db.delete(attempts).where(eq(attempts.userId, userId));
			await db.execute(sql`delete from users where id = ${userId}`);
		}
	}
};
