// GET /api/v1/review-queue: needs-review first then oldest, filters, sorts and cursor pages over every attempt.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { inArray } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { assignments, attempts, type AttemptVerdict } from '$lib/server/db/schema';
import { GET } from '../../src/routes/api/v1/review-queue/+server';
import { makeEvent, throughHooks } from './support/request-event';
import { demoAccount, freshLearner, removeFreshPeople, signedInCookies } from './support/people';

type Seed = { label: string; assignment: string; verdict: AttemptVerdict | null; status?: 'graded' | 'error' | 'queued'; review?: 'open' | 'reviewed'; daysAgo: number };

// invented attempts, spread over time; labels make failures readable
const SEEDS: Seed[] = [
	{ label: 'nr-old', assignment: 'off-the-axis', verdict: 'needs-review', daysAgo: 20 },
	{ label: 'nr-new', assignment: 'dim-the-sky', verdict: 'needs-review', daysAgo: 0.2 },
	{ label: 'fail-oldest', assignment: 'off-the-axis', verdict: 'fail', daysAgo: 30 },
	{ label: 'pass-mid', assignment: 'dim-the-sky', verdict: 'pass', daysAgo: 3 },
	{ label: 'error-mid', assignment: 'off-the-axis', verdict: null, status: 'error', daysAgo: 2 },
	{ label: 'fail-new', assignment: 'off-the-axis', verdict: 'fail', daysAgo: 0.5 },
	{ label: 'reviewed', assignment: 'off-the-axis', verdict: 'pass', review: 'reviewed', daysAgo: 10 },
	{ label: 'still-queued', assignment: 'off-the-axis', verdict: null, status: 'queued', daysAgo: 1.5 }
];

const ids = new Map<string, string>();
const labelOf = new Map<string, string>();

async function queue(query: string, who: 'mentor' | 'admin' = 'mentor') {
	const cookies = await signedInCookies(demoAccount(who).email);
	const outcome = await throughHooks(makeEvent({ path: `/api/v1/review-queue${query}`, cookies }), (e) => GET(e as never));
	const response = (outcome as { value: Response }).value;
	return { status: response.status, body: await response.json() };
}

/** Walks every page with this query and returns our seeded labels in the order served. */
async function walk(query: string, limit = 2): Promise<string[]> {
	const seen: string[] = [];
	let cursor = '';
	for (let page = 0; page < 200; page++) {
		const sep = query ? '&' : '?';
		const { status, body } = await queue(`${query}${sep}limit=${limit}${cursor ? `&cursor=${cursor}` : ''}`);
		expect(status).toBe(200);
		expect(body.attempts.length).toBeLessThanOrEqual(limit);
		for (const a of body.attempts) if (labelOf.has(a.id)) seen.push(labelOf.get(a.id)!);
		if (!body.nextCursor) return seen;
		cursor = body.nextCursor;
	}
	throw new Error('too many pages');
}

beforeAll(async () => {
	const learner = await freshLearner();
	const found = await db.select({ id: assignments.id, slug: assignments.slug }).from(assignments).where(inArray(assignments.slug, ['off-the-axis', 'dim-the-sky']));
	const bySlug = new Map(found.map((a) => [a.slug, a.id]));
	const now = Date.now();
	for (const s of SEEDS) {
		const id = randomUUID();
		ids.set(s.label, id);
		labelOf.set(id, s.label);
		await db.insert(attempts).values({
			id,
			userId: learner.id,
			assignmentId: bySlug.get(s.assignment)!,
			submissionKey: `seed-${s.label}`,
			status: s.status ?? 'graded',
			verdict: s.verdict,
			autoVerdict: s.verdict,
			reviewState: s.review ?? 'open',
			spec: { frames: [], criteria: [] },
			subjectBox: { x: 0.3, y: 0.2, w: 0.4, h: 0.6 },
			createdAt: new Date(now - s.daysAgo * 24 * 3600 * 1000)
		});
	}
});

afterAll(async () => {
	await db.delete(attempts).where(inArray(attempts.id, [...ids.values()]));
	await removeFreshPeople();
});

describe('review queue API', () => {
	test('default: open attempts, needs-review first (oldest first), then the rest oldest first; pages join up', async () => {
		expect(await walk('')).toEqual(['nr-old', 'nr-new', 'fail-oldest', 'pass-mid', 'error-mid', 'fail-new']);
		// the same order whatever the page size
		expect(await walk('', 1)).toEqual(await walk('', 5));
	});

	test('rows carry what the table shows, and nothing private', async () => {
		const { body } = await queue('?limit=100');
		const row = body.attempts.find((a: { id: string }) => a.id === ids.get('nr-old'));
		expect(row).toMatchObject({
			href: `/mentor/attempts/${ids.get('nr-old')}`,
			learner: 'Test Person',
			assignment: { slug: 'off-the-axis', title: 'Off the axis' },
			course: { slug: 'daylight-flash-for-action' },
			verdict: 'needs-review',
			reviewState: 'open'
		});
		expect(row.createdAt).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{6}Z$/);
		expect(JSON.stringify(body)).not.toMatch(/email|password|submission/i);
		expect(body.query).toEqual({ status: 'open', sort: 'queue', course: '', assignment: '', age: '', cohort: '', limit: 100 });
	});

	test('sorts: oldest and newest first, ignoring the verdict', async () => {
		expect(await walk('?sort=oldest')).toEqual(['fail-oldest', 'nr-old', 'pass-mid', 'error-mid', 'fail-new', 'nr-new']);
		expect(await walk('?sort=newest')).toEqual(['nr-new', 'fail-new', 'error-mid', 'pass-mid', 'nr-old', 'fail-oldest']);
	});

	test('filters: status, assignment, course and age', async () => {
		expect(await walk('?status=needs-review')).toEqual(['nr-old', 'nr-new']);
		expect(await walk('?status=reviewed')).toEqual(['reviewed']);
		expect((await walk('?status=all&sort=oldest')).sort()).toEqual([...SEEDS.map((s) => s.label).filter((l) => l !== 'still-queued')].sort());
		expect(await walk('?assignment=dim-the-sky')).toEqual(['nr-new', 'pass-mid']);
		expect(await walk('?course=daylight-flash-for-action&assignment=off-the-axis')).toEqual(['nr-old', 'fail-oldest', 'error-mid', 'fail-new']);
		expect(await walk('?course=no-such-course')).toEqual([]);
		expect(await walk('?age=today')).toEqual(['nr-new', 'fail-new']);
		expect(await walk('?age=week')).toEqual(['pass-mid', 'error-mid']);
		expect(await walk('?age=older')).toEqual(['nr-old', 'fail-oldest']);
	});

	test('a tampered cursor is a 400 with a message; unknown filter values fall back to defaults', async () => {
		const bad = await queue('?cursor=bm90LWEtY3Vyc29y');
		expect(bad).toMatchObject({ status: 400, body: { error: 'bad-cursor' } });
		const { body: first } = await queue('?limit=1');
		const otherSort = await queue(`?sort=newest&cursor=${first.nextCursor}`);
		expect(otherSort.status).toBe(400);
		const junk = await queue('?status=everything&sort=;drop&age=ancient');
		expect(junk.status).toBe(200);
		expect(junk.body.query).toMatchObject({ status: 'open', sort: 'queue', age: '' });
	});

	test('admins (who are mentors in the demo) see the same queue', async () => {
		const { status, body } = await queue('?limit=100', 'admin');
		expect(status).toBe(200);
		expect(body.attempts.some((a: { id: string }) => a.id === ids.get('nr-old'))).toBe(true);
	});
});
