// Benchmark: pages under load, against the built app. autocannon sends the same number of connections for the same
// time to a bare page, a lesson page and the course page in one run; each is printed as a ratio to the bare page, so
// the figures compare across machines. The time is split into rounds that take the pages in turn, and a ratio
// is the median of the rounds' ratios: on a shared machine, other work coming and going then weighs on every page
// alike instead of on whichever page was being measured. Run after `npm run build` (`npm run bench` builds first).
// The goals are for a visitor without a session, as most first visits are: such pages may come from the visitor page
// cache (src/lib/server/visitor-pages). For information, the same pages rendered (a cookie, so never from the cache)
// and the lesson for a signed-in learner are measured too, and each line gives the app's CPU time per request.
import { once } from 'node:events';
import { readFileSync } from 'node:fs';
import autocannon from 'autocannon';
import { eq } from 'drizzle-orm';
import { startBuiltApp } from './app-process';
import { lucia } from '../../src/lib/server/auth';
import { db } from '../../src/lib/server/db/index';
import { users } from '../../src/lib/server/db/schema';
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
/** Linux counts a process's CPU time in clock ticks of 1/100 s (USER_HZ). */
const TICKS_PER_SECOND = 100;

type Result = { requestsPerSecond: number; requests: number; cpuSeconds: number; non2xx: number; errors: number; p99: number };
/** The part of autocannon's result read here (the package ships no types). */
type Summary = { requests: { average: number; total: number }; latency: { p99: number }; non2xx: number; errors: number; timeouts: number };
type Target = { url: string; headers?: Record<string, string> };

/** The app's CPU time so far (user and system), in seconds, from /proc. */
function cpuSecondsOf(pid: number): number {
	const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
	return (Number(fields[11]) + Number(fields[12])) / TICKS_PER_SECOND;
}

function load(target: Target, seconds: number, pid: number): Promise<Result> {
	const cpuBefore = cpuSecondsOf(pid);
	return new Promise((resolve, reject) => {
		autocannon({ url: target.url, headers: target.headers, connections: CONNECTIONS, duration: seconds }, (error: Error | null, result: Summary) => {
			if (error) return reject(error);
			resolve({
				requestsPerSecond: result.requests.average,
				requests: result.requests.total,
				cpuSeconds: cpuSecondsOf(pid) - cpuBefore,
				non2xx: result.non2xx,
				errors: result.errors + result.timeouts,
				p99: result.latency.p99
			});
		});
	});
}

function median(values: number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	const mid = Math.floor(sorted.length / 2);
	return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** A session of the demo learner, made the way signing in makes one; ended when the bench is done. */
async function learnerSession(): Promise<{ cookie: string; end: () => Promise<void> }> {
	const demo = JSON.parse(readFileSync('scripts/demo-accounts.json', 'utf8')) as { role: string; email: string }[];
	const email = demo.find((a) => a.role === 'learner')!.email;
	const [user] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
	if (!user) throw new Error(`the demo learner ${email} is missing: seed the database first`);
	const session = await lucia.createSession(user.id, {});
	return { cookie: `${lucia.sessionCookieName}=${session.id}`, end: () => lucia.invalidateSession(session.id) };
}

export const pageLoadBench: Bench = {
	name: `pages under load: ${CONNECTIONS} connections for ${SECONDS} s each in ${ROUNDS} turns, against the built app (autocannon)`,
	async run() {
		const port = Number(process.env.STOPWISE_BENCH_APP_PORT ?? 4391);
		// grading stays out of this process: only page rendering is measured
		const app = await startBuiltApp(port, { STOPWISE_INLINE_WORKER: '0' });
		const learner = await learnerSession();
		try {
			const base = `http://127.0.0.1:${port}`;
			const lessonUrl = `${base}/courses/${COURSE}/${LESSON}`;
			const courseUrl = `${base}/courses/${COURSE}`;
			// any cookie makes a request a non-visitor's: rendered each time, as a signed-in person's page is
			const rendered = { cookie: 'bench=rendered' };
			const pages = {
				bare: { url: `${base}/` },
				lesson: { url: lessonUrl },
				course: { url: courseUrl },
				lessonRendered: { url: lessonUrl, headers: rendered },
				courseRendered: { url: courseUrl, headers: rendered },
				lessonLearner: { url: lessonUrl, headers: { cookie: learner.cookie } }
			} satisfies Record<string, Target>;
			type Name = keyof typeof pages;
			const names = Object.keys(pages) as Name[];
			// every page answers once before timing starts (a lesson's first render is not what is measured)
			for (const name of names) {
				const { url, headers } = pages[name];
				const response = await fetch(url, { headers, redirect: 'manual' });
				if (response.status !== 200) throw new Error(`${name} page ${url} answered ${response.status}`);
			}
			// and a second of load each, so the first page timed does not carry the app's warming up alone
			for (const name of names) await load(pages[name], 1, app.pid!);
			const rounds: Record<Name, Result>[] = [];
			for (let i = 0; i < ROUNDS; i++) {
				const round = {} as Record<Name, Result>;
				for (const name of names) round[name] = await load(pages[name], SECONDS / ROUNDS, app.pid!);
				rounds.push(round);
			}
			const overall = (name: Name): Result => {
				const sum = (pick: (r: Result) => number) => rounds.reduce((total, r) => total + pick(r[name]), 0);
				return {
					requestsPerSecond: sum((r) => r.requestsPerSecond) / rounds.length,
					requests: sum((r) => r.requests),
					cpuSeconds: sum((r) => r.cpuSeconds),
					p99: Math.max(...rounds.map((r) => r[name].p99)),
					non2xx: sum((r) => r.non2xx),
					errors: sum((r) => r.errors)
				};
			};
			const ratio = (name: Name) => median(rounds.map((r) => r[name].requestsPerSecond / r.bare.requestsPerSecond));
			const line = (name: Name, label: string, goal?: number) => {
				const r = overall(name);
				const each = rounds.map((round) => (round[name].requestsPerSecond / round.bare.requestsPerSecond).toFixed(2)).join(' ');
				const cpu = r.requests ? ((r.cpuSeconds * 1000) / r.requests).toFixed(2) : '?';
				return (
					`${label.padEnd(34)} ${r.requestsPerSecond.toFixed(0).padStart(6)} req/s  p99 ${String(r.p99).padStart(4)} ms  ` +
					`app CPU ${cpu.padStart(5)} ms/request  ${ratio(name).toFixed(2)}× the bare page${goal ? ` (goal ≥ ${goal}×; rounds ${each})` : ''}` +
					`${r.non2xx || r.errors ? `  ${r.non2xx} non-2xx, ${r.errors} errors` : ''}`
				);
			};
			const clean = names.every((name) => overall(name).non2xx === 0 && overall(name).errors === 0);
			return {
				lines: [
					line('bare', 'bare page'),
					line('lesson', 'lesson page', GOALS.lesson),
					line('course', 'course page', GOALS.course),
					'for information (no goal): rendered for each request',
					line('lessonRendered', 'lesson page, not from the cache'),
					line('courseRendered', 'course page, not from the cache'),
					line('lessonLearner', 'lesson page, signed-in learner')
				],
				ok: clean && ratio('lesson') >= GOALS.lesson && ratio('course') >= GOALS.course
			};
		} finally {
			await learner.end();
			// requests autocannon left in flight finish before the app's database pool closes
			await new Promise((settled) => setTimeout(settled, 1000));
			app.kill();
			await once(app, 'exit');
		}
	}
};
