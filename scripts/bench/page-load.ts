// Benchmark: pages under load, against the built app. autocannon sends the same number of connections for the same
// time to a bare page, a lesson page and the course page in one run; each is printed as a ratio to the bare page, so
// the figures compare across machines. The time is split into rounds that take the three pages in turn, and a ratio
// is the median of the rounds' ratios: on a shared machine, other work coming and going then weighs on every page
// alike instead of on whichever page was being measured. Run after `npm run build` (`npm run bench` builds first).
import { once } from 'node:events';
import autocannon from 'autocannon';
import { startBuiltApp } from './app-process';
import type { Bench } from './timing';

const COURSE = 'daylight-flash-for-action';
/** A free-preview lesson, so a visitor without a session may load it (as most first visits do). */
const LESSON = 'guide-numbers';
const CONNECTIONS = 10;
const SECONDS = Number(process.env.STOPWISE_BENCH_LOAD_SECONDS ?? 8);
/** Each page gets SECONDS in all, in this many turns. */
const ROUNDS = Math.max(1, Number(process.env.STOPWISE_BENCH_LOAD_ROUNDS ?? 4));
/** Goals, as ratios to the bare page in the same run. */
const GOALS = { lesson: 0.7, course: 0.6 } as const;

type Result = { requestsPerSecond: number; non2xx: number; errors: number; p99: number };
/** The part of autocannon's result read here (the package ships no types). */
type Summary = { requests: { average: number }; latency: { p99: number }; non2xx: number; errors: number; timeouts: number };

function load(url: string, seconds: number): Promise<Result> {
	return new Promise((resolve, reject) => {
		autocannon({ url, connections: CONNECTIONS, duration: seconds }, (error: Error | null, result: Summary) => {
			if (error) return reject(error);
			resolve({ requestsPerSecond: result.requests.average, non2xx: result.non2xx, errors: result.errors + result.timeouts, p99: result.latency.p99 });
		});
	});
}

function median(values: number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	const mid = Math.floor(sorted.length / 2);
	return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

export const pageLoadBench: Bench = {
	name: `pages under load: ${CONNECTIONS} connections for ${SECONDS} s each in ${ROUNDS} turns, against the built app (autocannon)`,
	async run() {
		const port = Number(process.env.STOPWISE_BENCH_APP_PORT ?? 4391);
		// grading stays out of this process: only page rendering is measured
		const app = await startBuiltApp(port, { STOPWISE_INLINE_WORKER: '0' });
		try {
			const base = `http://127.0.0.1:${port}`;
			const pages = { bare: `${base}/`, lesson: `${base}/courses/${COURSE}/${LESSON}`, course: `${base}/courses/${COURSE}` };
			// every page answers once before timing starts (a lesson's first render is not what is measured)
			for (const [name, url] of Object.entries(pages)) {
				const response = await fetch(url);
				if (response.status !== 200) throw new Error(`${name} page ${url} answered ${response.status}`);
			}
			const rounds: Record<keyof typeof pages, Result>[] = [];
			for (let i = 0; i < ROUNDS; i++) {
				const bare = await load(pages.bare, SECONDS / ROUNDS);
				const lesson = await load(pages.lesson, SECONDS / ROUNDS);
				const course = await load(pages.course, SECONDS / ROUNDS);
				rounds.push({ bare, lesson, course });
			}
			const overall = (name: keyof typeof pages): Result => ({
				requestsPerSecond: rounds.reduce((sum, r) => sum + r[name].requestsPerSecond, 0) / rounds.length,
				p99: Math.max(...rounds.map((r) => r[name].p99)),
				non2xx: rounds.reduce((sum, r) => sum + r[name].non2xx, 0),
				errors: rounds.reduce((sum, r) => sum + r[name].errors, 0)
			});
			const ratio = (name: keyof typeof pages) => median(rounds.map((r) => r[name].requestsPerSecond / r.bare.requestsPerSecond));
			const line = (name: keyof typeof pages, label: string, goal?: number) => {
				const r = overall(name);
				const each = rounds.map((round) => (round[name].requestsPerSecond / round.bare.requestsPerSecond).toFixed(2)).join(' ');
				return (
					`${label.padEnd(12)} ${r.requestsPerSecond.toFixed(0).padStart(6)} req/s  p99 ${String(r.p99).padStart(4)} ms  ` +
					`${ratio(name).toFixed(2)}× the bare page${goal ? ` (goal ≥ ${goal}×; rounds ${each})` : ''}` +
					`${r.non2xx || r.errors ? `  ${r.non2xx} non-2xx, ${r.errors} errors` : ''}`
				);
			};
			const clean = (['bare', 'lesson', 'course'] as const).every((name) => overall(name).non2xx === 0 && overall(name).errors === 0);
			return {
				lines: [line('bare', 'bare page'), line('lesson', 'lesson page', GOALS.lesson), line('course', 'course page', GOALS.course)],
				ok: clean && ratio('lesson') >= GOALS.lesson && ratio('course') >= GOALS.course
			};
		} finally {
			app.kill();
			await once(app, 'exit');
		}
	}
};
