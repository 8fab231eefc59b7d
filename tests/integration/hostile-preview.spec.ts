// A hostile lesson preview cannot freeze the app: its cost is refused before compiling, compiling runs in a worker
// pool bounded in time, and the health route keeps answering meanwhile (the one latency bound this suite measures).
import { afterEach, describe, expect, test } from 'vitest';
import { GET as health } from '../../src/routes/api/health/+server';
import { POST as preview } from '../../src/routes/api/v1/author/preview/+server';
import { makeEvent, throughHooks, valueOf } from './support/request-event';
import { demoAccount, signedInCookies } from './support/people';

// what the issue asks of the app while a preview is being rendered
const HEALTH_BOUND_MS = 200;

async function postPreview(body: string) {
	const cookies = await signedInCookies(demoAccount('author').email);
	const outcome = await throughHooks(makeEvent({ path: '/api/v1/author/preview', cookies, json: { body } }), (e) => preview(e as never));
	const response = valueOf<Response>(outcome);
	return { status: response.status, body: (await response.json()) as { segments: { kind: string; html?: string }[]; problems: string[] } };
}

/** Calls the health route again and again until `done` settles; every answer's latency in ms. */
async function healthWhile(done: Promise<unknown>): Promise<{ latencies: number[]; statuses: number[] }> {
	let settled = false;
	void done.finally(() => (settled = true));
	const latencies: number[] = [];
	const statuses: number[] = [];
	while (!settled) {
		const start = performance.now();
		const response = await health();
		latencies.push(performance.now() - start);
		statuses.push(response.status);
		await new Promise((r) => setTimeout(r, 25));
	}
	return { latencies, statuses };
}

const saved = process.env.STOPWISE_RENDER_TIME_LIMIT_MS;
afterEach(() => {
	if (saved === undefined) delete process.env.STOPWISE_RENDER_TIME_LIMIT_MS;
	else process.env.STOPWISE_RENDER_TIME_LIMIT_MS = saved;
});

describe('a hostile lesson preview', () => {
	test('about 100 000 "[" get a clear message and the text back as plain text, not a frozen app', async () => {
		const hostile = '['.repeat(100_000);
		const pending = postPreview(hostile);
		const { statuses } = await healthWhile(pending);
		const res = await pending;
		expect(res.status).toBe(200);
		expect(res.body.problems).toEqual([expect.stringMatching(/too heavy to render .*long runs of \[ \* _ or < characters/)]);
		expect(res.body.segments).toHaveLength(1);
		expect(res.body.segments[0].html).toContain('[[[[');
		expect(statuses.every((s) => s === 200)).toBe(true);
	});

	test('heavy text within the cost limit compiles in the worker pool while /api/health answers within 200 ms', async () => {
		process.env.STOPWISE_RENDER_TIME_LIMIT_MS = '20000';
		// within the cost limit, yet a second or more of compiling: on the request thread this would stall every request
		const heavy = '['.repeat(6_000);
		const pending = postPreview(heavy);
		const { latencies, statuses } = await healthWhile(pending);
		const res = await pending;
		expect(res.status).toBe(200);
		expect(res.body.problems).toEqual([]);
		// the health route was asked several times while the preview was being compiled, and never waited for it
		expect(latencies.length).toBeGreaterThanOrEqual(3);
		expect(statuses.every((s) => s === 200)).toBe(true);
		expect(Math.max(...latencies)).toBeLessThan(HEALTH_BOUND_MS);
	});

	test('a render over STOPWISE_RENDER_TIME_LIMIT_MS is stopped and says so; the next one works again', async () => {
		process.env.STOPWISE_RENDER_TIME_LIMIT_MS = '150';
		const slow = 'a_b '.repeat(700);
		const res = await postPreview(slow);
		expect(res.status).toBe(200);
		expect(res.body.problems).toEqual([expect.stringMatching(/took longer than 150 ms to render, so it was stopped/)]);
		expect(res.body.segments[0].html).toContain('a_b a_b');
		delete process.env.STOPWISE_RENDER_TIME_LIMIT_MS;
		const after = await postPreview('Hello *there*');
		expect(after.body).toEqual({ segments: [{ kind: 'html', html: '<p>Hello <em>there</em></p>' }], problems: [] });
	});
});
