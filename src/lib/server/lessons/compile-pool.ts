// The worker-thread pool that compiles lesson prose off the request thread, each render bounded in time.
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Piscina } from 'piscina';

export type CompiledChunk = { ok: true; code: string; frontmatter: boolean } | { ok: false; message: string };
export type CompileOutcome = { ok: true; chunks: CompiledChunk[] } | { ok: false; reason: 'time' | 'busy'; message: string };

/** How long one lesson's prose may take to compile (env STOPWISE_RENDER_TIME_LIMIT_MS), default 5 s. */
export function renderTimeLimitMs(): number {
	const raw = Number(process.env.STOPWISE_RENDER_TIME_LIMIT_MS);
	return Number.isFinite(raw) && raw > 0 ? raw : 5_000;
}

// renders waiting beyond this many are refused at once: a burst of previews must not queue up without end
const MAX_QUEUE = 32;

let pool: Piscina | null = null;

/** The worker file: beside this module in development and tests; from the project folder in the built app. */
function workerFile(): string {
	const here = fileURLToPath(new URL('./compile-worker.mjs', import.meta.url));
	return existsSync(here) ? here : resolve(process.cwd(), 'src/lib/server/lessons/compile-worker.mjs');
}

function thePool(): Piscina {
	// one core stays with the requests; the pool's threads end when idle
	pool ??= new Piscina({
		filename: workerFile(),
		minThreads: 0,
		maxThreads: Math.max(1, Math.min(2, availableParallelism() - 1)),
		idleTimeout: 30_000,
		maxQueue: MAX_QUEUE
	});
	return pool;
}

/** Compiles each chunk in a worker; a render over the time limit is stopped (its thread ends) and reported. */
export async function compileInPool(chunks: string[]): Promise<CompileOutcome> {
	if (chunks.length === 0) return { ok: true, chunks: [] };
	const limit = renderTimeLimitMs();
	try {
		const compiled = (await thePool().run(chunks, { signal: AbortSignal.timeout(limit) })) as CompiledChunk[];
		return { ok: true, chunks: compiled };
	} catch (e) {
		const name = (e as { name?: string })?.name;
		if (name === 'AbortError' || name === 'TimeoutError') {
			return { ok: false, reason: 'time', message: `This text took longer than ${formatSeconds(limit)} to render, so it was stopped and is shown as plain text: look for long runs of [ * _ or < characters.` };
		}
		if (/queue is at limit/i.test(String((e as Error)?.message))) {
			return { ok: false, reason: 'busy', message: 'Too many lessons are being rendered right now; the text is shown as plain text. Try again in a moment.' };
		}
		throw e;
	}
}

function formatSeconds(ms: number): string {
	return ms >= 1000 ? `${Math.round(ms / 100) / 10} s` : `${ms} ms`;
}

/** Ends the pool's threads (at shutdown). */
export async function closeCompilePool(): Promise<void> {
	const p = pool;
	pool = null;
	await p?.destroy();
}
