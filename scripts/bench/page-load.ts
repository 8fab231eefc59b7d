// Benchmark: pages under load, against the built app. autocannon sends the same number of connections for the same
// time to a bare page, a lesson page and the course page, one after another in one run; each is printed as a ratio
// to the bare page, so the figures compare across machines. Run after `npm run build` (`npm run bench` builds first).
import { once } from 'node:events';
import autocannon from 'autocannon';
import { startBuiltApp } from './app-process';
import type { Bench } from './timing';

const COURSE = 'daylight-flash-for-action';
/** A free-preview lesson, so a visitor without a session may load it (as most first visits do). */
const LESSON = 'guide-numbers';
const CONNECTIONS = 10;
const SECONDS = Number(process.env.STOPWISE_BENCH_LOAD_SECONDS ?? 8);
/** Goals, as ratios to the bare page in the same run. */
const GOALS = { lesson: 0.7, course: 0.6 } as const;

type Result = { requestsPerSecond: number; non2xx: number; errors: number; p99: number };
/** The part of autocannon's result read here (the package ships no types). */
type Summary = { requests: { average: number }; latency: { p99: number }; non2xx: number; errors: number; timeouts: number };

function load(url: string): Promise<Result> {
	return new Promise((resolve, reject) => {
		autocannon({ url, connections: CONNECTIONS, duration: SECONDS }, (error: Error | null, result: Summary) => {
			if (error) return reject(error);
			resolve({ requestsPerSecond: result.requests.average, non2xx: result.non2xx, errors: result.errors + result.timeouts, p99: result.latency.p99 });
		});
	});
}

export const pageLoadBench: Bench = {
	name: `pages under load: ${CONNECTIONS} connections for ${SECONDS} s each, against the built app (autocannon)`,
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
			const bare = await load(pages.bare);
			const lesson = await load(pages.lesson);
			const course = await load(pages.course);
			const ratio = (r: Result) => r.requestsPerSecond / bare.requestsPerSecond;
			const line = (name: string, r: Result, goal?: number) =>
				`${name.padEnd(12)} ${r.requestsPerSecond.toFixed(0).padStart(6)} req/s  p99 ${String(r.p99).padStart(4)} ms  ` +
				`${ratio(r).toFixed(2)}× the bare page${goal ? ` (goal ≥ ${goal}×)` : ''}${r.non2xx || r.errors ? `  ${r.non2xx} non-2xx, ${r.errors} errors` : ''}`;
			const clean = [bare, lesson, course].every((r) => r.non2xx === 0 && r.errors === 0);
			return {
				lines: [line('bare page', bare), line('lesson page', lesson, GOALS.lesson), line('course page', course, GOALS.course)],
				ok: clean && ratio(lesson) >= GOALS.lesson && ratio(course) >= GOALS.course
			};
		} finally {
			app.kill();
			await once(app, 'exit');
		}
	}
};
