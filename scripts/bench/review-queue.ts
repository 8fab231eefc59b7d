// Benchmark: the mentor's review-queue query at 10,000 attempts and again at 100,000 (10,000 learners), in one run.
import { sql } from 'drizzle-orm';
import { db } from '../../src/lib/server/db/index';
import { readQueueParams } from '../../src/lib/attempts/queue-params';
import { fetchReviewQueue } from '../../src/lib/server/review/queue-query';
import { ms, type Bench } from './timing';

const LEARNERS = 10_000;
const SMALL = 10_000;
const LARGE = 100_000;
const TARGET_RATIO = 1.5;
const TARGET_P95_MS = 20;
const ROUNDS = 40;

/** Invented learners, set-based: one INSERT … SELECT generate_series. */
async function seedLearners(): Promise<void> {
	await db.execute(sql`
		insert into users (id, email, name, roles, email_verified)
		select 'bench-learner-' || g, 'bench-learner-' || g || '@bench.example', 'Bench learner ' || g || ' (invented)', '{learner}', true
		from generate_series(1, ${LEARNERS}::int) g
		on conflict do nothing`);
}

/**
 * Attempts from..to, spread over the assignments and learners, over the last 120 days: 70 % already reviewed;
 * of the rest 15 % need review, 1 % errored, the others passed or failed. Two frame rows each, as an upload makes.
 */
async function seedAttempts(from: number, to: number): Promise<void> {
	await db.execute(sql`select setseed(0.42)`);
	await db.execute(sql`
		with a as (select array_agg(id order by id) as ids from assignments),
		r as (select g, random() as v, random() as w, now() - random() * interval '120 days' as t from generate_series(${from}::int, ${to}::int) g)
		insert into attempts (id, user_id, assignment_id, submission_key, status, auto_verdict, verdict, review_state, spec, subject_box, result, grade_runs, created_at, graded_at)
		select md5('bench' || r.g)::uuid::text, 'bench-learner-' || (r.g % ${LEARNERS}::int + 1), a.ids[r.g % array_length(a.ids, 1) + 1], 'bench-' || r.g,
			case when r.v < 0.01 then 'error' else 'graded' end,
			case when r.v < 0.01 then null when r.v < 0.16 then 'needs-review' when r.v < 0.55 then 'fail' else 'pass' end,
			case when r.v < 0.01 then null when r.v < 0.16 then 'needs-review' when r.v < 0.55 then 'fail' else 'pass' end,
			case when r.w < 0.7 then 'reviewed' else 'open' end,
			'{}'::jsonb, '{"x":0.3,"y":0.2,"w":0.4,"h":0.6}'::jsonb, '{"criteria":[]}'::jsonb, 1,
			r.t, r.t + interval '2 seconds'
		from r, a`);
	await db.execute(sql`
		insert into attempt_frames (attempt_id, name, original_key, large_key, thumb_key, mime, bytes)
		select md5('bench' || g)::uuid::text, f.name, 'bench/' || g || '/' || f.i, 'bench/' || g || '/' || f.i || 'l', 'bench/' || g || '/' || f.i || 't', 'image/jpeg', 9000000
		from generate_series(${from}::int, ${to}::int) g, (values (0, 'reference'), (1, 'lit')) f(i, name)`);
	await db.execute(sql`analyze attempts`);
	await db.execute(sql`analyze attempt_frames`);
}

async function removeBenchRows(): Promise<void> {
	await db.execute(sql`delete from attempts where submission_key like 'bench-%'`);
	await db.execute(sql`delete from users where id like 'bench-learner-%'`);
}

function percentile(values: number[], p: number): number {
	const sorted = [...values].sort((a, b) => a - b);
	return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

const REVIEWER = 'bench-reviewer-with-no-attempts';

/** The queries a mentor's table makes: first page, the next page, and filtered views. */
async function timeQueue(): Promise<{ median: number; p95: number; rows: number }> {
	// the queue hides a mentor's own attempts; the bench reads as a mentor who has none
	const first = await fetchReviewQueue(readQueueParams(new URLSearchParams()), REVIEWER);
	if (!first.ok) throw new Error(first.message);
	const assignment = (await db.execute(sql`select slug from assignments order by id limit 1`)) as unknown as { slug: string }[];
	const variants = [
		'',
		`cursor=${first.nextCursor ?? ''}`,
		`assignment=${assignment[0].slug}`,
		'age=week',
		'status=needs-review',
		'status=reviewed&sort=newest'
	].map((q) => readQueueParams(new URLSearchParams(q)));
	const samples: number[] = [];
	const perVariant = variants.map(() => [] as number[]);
	for (let round = 0; round < ROUNDS + 3; round++) {
		for (const [i, params] of variants.entries()) {
			const start = performance.now();
			const page = await fetchReviewQueue(params, REVIEWER);
			if (!page.ok) throw new Error(page.message);
			if (round >= 3) {
				samples.push(performance.now() - start);
				perVariant[i].push(performance.now() - start);
			}
		}
	}
	if (process.env.BENCH_VERBOSE) console.log(perVariant.map((v, i) => `${i}: med ${percentile(v, 50).toFixed(2)} p95 ${percentile(v, 95).toFixed(2)}`).join(' | '));
	return { median: percentile(samples, 50), p95: percentile(samples, 95), rows: first.rows.length };
}

export const reviewQueueBench: Bench = {
	name: `review queue (${SMALL.toLocaleString('en')} vs ${LARGE.toLocaleString('en')} attempts, ${LEARNERS.toLocaleString('en')} learners)`,
	async run() {
		await removeBenchRows();
		try {
			let started = performance.now();
			await seedLearners();
			await seedAttempts(1, SMALL);
			const seededSmall = performance.now() - started;
			const small = await timeQueue();
			started = performance.now();
			await seedAttempts(SMALL + 1, LARGE);
			const seededLarge = performance.now() - started;
			const large = await timeQueue();
			const ratio = large.median / small.median;
			const ok = ratio <= TARGET_RATIO && large.p95 < TARGET_P95_MS;
			return {
				ok,
				lines: [
					`seeded ${SMALL.toLocaleString('en')} attempts in ${ms(seededSmall)}, ${(LARGE - SMALL).toLocaleString('en')} more in ${ms(seededLarge)} (set-based INSERT … SELECT generate_series)`,
					`at ${SMALL.toLocaleString('en')}:  median ${ms(small.median)}, p95 ${ms(small.p95)} (6 query shapes × ${ROUNDS} rounds; first page ${small.rows} rows)`,
					`at ${LARGE.toLocaleString('en')}: median ${ms(large.median)}, p95 ${ms(large.p95)}`,
					`ratio ${ratio.toFixed(2)} × (target ≤ ${TARGET_RATIO}), p95 at ${LARGE.toLocaleString('en')} ${ms(large.p95)} (target < ${TARGET_P95_MS} ms) ${ok ? 'OK' : 'MISSED'}`
				]
			};
		} finally {
			await removeBenchRows();
		}
	}
};
