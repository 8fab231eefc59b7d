// The visitor page cache against the real PostgreSQL: the content epoch moves with every committed change to a table
// the cached pages read, a visitor's kept page gives way to the new one on the next request (publish, unpublish, a
// change written straight into the database), a request with a cookie is never answered from it nor stored, and it
// stays within its bound.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { eq, sql } from 'drizzle-orm';
import { isHttpError, isRedirect, type RequestEvent } from '@sveltejs/kit';
import { client, db } from '$lib/server/db';
import { assignments, courses, lessonClips, lessons, modules } from '$lib/server/db/schema';
import { createVisitorPageCache, type VisitorPageCache } from '$lib/server/visitor-pages/cache';
import { readContentEpoch } from '$lib/server/visitor-pages/epoch';
import { CACHED_ROUTES } from '$lib/server/visitor-pages/rules';
import { loadLessonPage } from '$lib/server/lessons/page';
import { createLesson } from '$lib/server/authoring/lessons';
import { publishDraft, unpublishLesson } from '$lib/server/authoring/versions';
import { createClip } from '$lib/server/clips/records';
import { load as coursePageLoad } from '../../src/routes/(public)/courses/[course]/+page.server';
import { demoAccount, userIdOf } from './support/people';
import { makeEvent } from './support/request-event';
import { moduleIdOf } from './support/course';

const COURSE = 'daylight-flash-for-action';
const LESSON_ROUTE = '/(learn)/courses/[course]/[lesson]';
const COURSE_ROUTE = '/(public)/courses/[course]';
const slug = `t-visitor-cache-${Date.now().toString(36)}`;
let authorId: string;
let lessonId: number;

beforeAll(async () => {
	authorId = await userIdOf(demoAccount('author').email);
	const created = await createLesson(
		{ moduleId: await moduleIdOf(COURSE), slug, title: 'Reach at the boat ramp', summary: 'A free lesson for the cache.', minutes: 5, freePreview: true },
		authorId
	);
	if (!created.ok) throw new Error(created.message);
	lessonId = created.lessonId;
});

afterAll(async () => {
	await db.delete(lessons).where(eq(lessons.slug, slug));
});

/** The page as its route's load sees it, answered the way Kit answers a load: JSON, a redirect or an error status. */
async function renderPage(event: RequestEvent): Promise<Response> {
	try {
		const { course, lesson } = event.params as { course: string; lesson?: string };
		const data =
			event.route.id === LESSON_ROUTE
				? await loadLessonPage(event.locals.user ?? null, event.url, course, lesson!)
				: await coursePageLoad(event as Parameters<typeof coursePageLoad>[0]);
		return new Response(JSON.stringify(data), { headers: { 'content-type': 'application/json' } });
	} catch (e) {
		if (isRedirect(e)) return new Response(null, { status: e.status, headers: { location: e.location } });
		if (isHttpError(e)) return new Response(e.body.message, { status: e.status });
		throw e;
	}
}

/** A GET through the cache's handle: what came back, and whether the page was rendered for it. */
async function get(cache: VisitorPageCache, path: string, init: { headers?: Record<string, string>; method?: string } = {}) {
	const [, course, lesson] = /^\/courses\/([^/?]+)(?:\/([^/?]+))?/.exec(path)!;
	const event = makeEvent({ path, method: init.method ?? 'GET', headers: init.headers, routeId: lesson ? LESSON_ROUTE : COURSE_ROUTE, params: lesson ? { course, lesson } : { course } });
	event.locals.user = null;
	let rendered = false;
	const response = await cache.handle({
		event,
		resolve: (e) => {
			rendered = true;
			return renderPage(e);
		}
	});
	return { status: response.status, text: await response.text(), rendered };
}

const lessonPath = () => `/courses/${COURSE}/${slug}`;
const publish = async (body: string, title = 'Reach at the boat ramp') => {
	const result = await publishDraft(lessonId, authorId, { title, summary: 'A free lesson for the cache.', body, note: '' });
	expect(result).toMatchObject({ ok: true });
};

describe('the content epoch', () => {
	/** Changes one row of the table to itself: a write that changes nothing a reader sees, but is a write. */
	async function touch(table: string) {
		const rows = await client.unsafe(`update "${table}" set id = id where id = (select min(id) from "${table}") returning id`);
		expect(rows.length).toBe(1);
	}

	test('moves with a committed change to each table the cached pages read', async () => {
		for (const table of ['courses', 'modules', 'lessons', 'assignments']) {
			const before = await readContentEpoch();
			await touch(table);
			expect(await readContentEpoch(), table).toBeGreaterThan(before);
		}
		// lesson_clips may be empty: a new clip and its removal
		const before = await readContentEpoch();
		const clipId = await createClip({ lessonId, name: 'ramp', title: 'At the ramp', captions: 'WEBVTT\n', createdBy: authorId });
		expect(clipId).not.toBeNull();
		const afterInsert = await readContentEpoch();
		expect(afterInsert).toBeGreaterThan(before);
		await db.delete(lessonClips).where(eq(lessonClips.id, clipId!));
		expect(await readContentEpoch()).toBeGreaterThan(afterInsert);
	});

	test('moves once per transaction, when it commits; a rolled-back change leaves it alone', async () => {
		const before = await readContentEpoch();
		await db.transaction(async (tx) => {
			await tx.update(lessons).set({ minutes: sql`${lessons.minutes}` }).where(eq(lessons.id, lessonId));
			await tx.update(modules).set({ title: sql`${modules.title}` });
			await tx.update(courses).set({ title: sql`${courses.title}` });
			// not yet visible to anyone else: the rise comes with the commit
			const [seen] = await client`select epoch from visitor_page_epoch`;
			expect(BigInt(seen.epoch)).toBe(before);
		});
		expect(await readContentEpoch()).toBe(before + 1n);
		await db
			.transaction(async (tx) => {
				await tx.update(assignments).set({ title: sql`${assignments.title}` });
				tx.rollback();
			})
			.catch(() => {});
		expect(await readContentEpoch()).toBe(before + 1n);
	});

	test('moves when a table is emptied (TRUNCATE has no row trigger of its own)', async () => {
		const before = await readContentEpoch();
		await client
			.begin(async (tx) => {
				await tx`truncate lesson_clips cascade`;
				const [inside] = await tx`select epoch from visitor_page_epoch`;
				expect(BigInt(inside.epoch)).toBeGreaterThan(before);
				throw new Error('undo');
			})
			.catch((e: Error) => expect(e.message).toBe('undo'));
	});
});

describe('a visitor page kept in memory', () => {
	test('is sent again until a publish, an unpublish or a change in the database; then the next request shows it', async () => {
		const cache = createVisitorPageCache({ maxBytes: 4 * 1024 * 1024 });
		await publish('The first text about the ramp.');
		const first = await get(cache, lessonPath());
		expect(first).toMatchObject({ status: 200, rendered: true });
		expect(first.text).toContain('The first text about the ramp.');
		// the same again, from memory
		expect(await get(cache, lessonPath())).toEqual({ ...first, rendered: false });

		await publish('The second text about the ramp.');
		const second = await get(cache, lessonPath());
		expect(second).toMatchObject({ status: 200, rendered: true });
		expect(second.text).toContain('The second text about the ramp.');
		expect((await get(cache, lessonPath())).rendered).toBe(false);

		// written straight into the database, as another process or a person at the SQL prompt would
		await db.update(lessons).set({ title: 'Reach at the slipway' }).where(eq(lessons.id, lessonId));
		const retitled = await get(cache, lessonPath());
		expect(retitled.rendered).toBe(true);
		expect(JSON.parse(retitled.text).lesson.title).toBe('Reach at the slipway');

		// the course page lists it, and stops listing it when it is unpublished
		const course = await get(cache, `/courses/${COURSE}`);
		expect(course.text).toContain('Reach at the slipway');
		expect((await get(cache, `/courses/${COURSE}`)).rendered).toBe(false);
		expect(await unpublishLesson(lessonId)).toMatchObject({ ok: true });
		expect(await get(cache, lessonPath())).toMatchObject({ status: 404, rendered: true });
		const without = await get(cache, `/courses/${COURSE}`);
		expect(without.rendered).toBe(true);
		expect(without.text).not.toContain('Reach at the slipway');
		// a 404 is never kept
		expect(await get(cache, lessonPath())).toMatchObject({ status: 404, rendered: true });
	});

	test('a request with a cookie, with credentials or not a GET is never answered from memory and never kept', async () => {
		const cache = createVisitorPageCache({ maxBytes: 4 * 1024 * 1024 });
		await publish('Text for the cookie check.');
		const signedIn = { cookie: 'auth_session=whatever' };
		expect((await get(cache, lessonPath(), { headers: signedIn })).rendered).toBe(true);
		expect(cache.stats().pages).toBe(0);
		// a visitor's copy is kept, and still not sent to someone with a cookie
		expect((await get(cache, lessonPath())).rendered).toBe(true);
		expect(cache.stats().pages).toBe(1);
		expect((await get(cache, lessonPath(), { headers: signedIn })).rendered).toBe(true);
		expect((await get(cache, lessonPath(), { headers: { authorization: 'Bearer x' } })).rendered).toBe(true);
		expect((await get(cache, lessonPath(), { method: 'HEAD' })).rendered).toBe(true);
		expect(cache.stats().pages).toBe(1);
	});

	test('a paid lesson answers a visitor with a redirect, which is never kept', async () => {
		const cache = createVisitorPageCache({ maxBytes: 4 * 1024 * 1024 });
		// a members-only lesson of the demo course
		const path = `/courses/${COURSE}/equivalent-exposures`;
		expect(await get(cache, path)).toMatchObject({ status: 303, rendered: true });
		expect(await get(cache, path)).toMatchObject({ status: 303, rendered: true });
		expect(cache.stats().pages).toBe(0);
	});

	test('stays within its bound, letting the least recently used pages go; 0 turns it off', async () => {
		const bound = 64 * 1024;
		const cache = createVisitorPageCache({ maxBytes: bound });
		const paths = Array.from({ length: 12 }, (_, i) => `/courses/${COURSE}?view=${i}`);
		for (const path of paths) expect((await get(cache, path)).rendered).toBe(true);
		const { pages, bytes } = cache.stats();
		expect(bytes).toBeLessThanOrEqual(bound);
		expect(pages).toBeGreaterThan(0);
		expect(pages).toBeLessThan(paths.length);
		// the newest is still there, the oldest was let go
		expect((await get(cache, paths.at(-1)!)).rendered).toBe(false);
		expect((await get(cache, paths[0])).rendered).toBe(true);

		const off = createVisitorPageCache({ maxBytes: 0 });
		expect((await get(off, paths[0])).rendered).toBe(true);
		expect((await get(off, paths[0])).rendered).toBe(true);
		expect(off.stats().pages).toBe(0);
	});
});

test('every route on the allow-list is a page on disk', () => {
	for (const id of CACHED_ROUTES) expect(existsSync(join('src/routes', id, '+page.svelte')), id).toBe(true);
});
