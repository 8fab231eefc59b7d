// The mentor's review queue: filters, needs-review-first order and keyset pages, each page a few index range scans.
import { and, eq, sql, type SQL } from 'drizzle-orm';
import { db } from '../db/index';
import { assignments, courses, lessons, modules, type AttemptStatus, type AttemptVerdict } from '../db/schema';
import type { QueueParams } from '../../attempts/queue-params';
import { frameFileHref } from '../attempts/files';
import { decodeCursor, encodeCursor, type QueueCursor } from './cursor';
import { cohortOptions } from '../cohorts/schedule';

export interface QueueRow {
	id: string;
	href: string;
	learner: string;
	assignment: { slug: string; title: string };
	course: { slug: string; title: string };
	status: AttemptStatus;
	verdict: AttemptVerdict | null;
	autoVerdict: AttemptVerdict | null;
	reviewState: 'open' | 'reviewed';
	createdAt: string;
	thumb: string | null;
	/** sent after the due date of a cohort the learner belongs to */
	late: boolean;
}

export type QueueAnswer = { ok: true; rows: QueueRow[]; nextCursor: string | null } | { ok: false; message: string };

type VerdictKey = AttemptVerdict | null;
interface Part {
	reviewState: 'open' | 'reviewed';
	verdict: VerdictKey;
	group: 0 | 1;
}

const DAY = 24 * 3600 * 1000;

/** The (review state, verdict) pairs to scan: each is one range of attempts_queue_idx, already in time order. */
function partsFor(params: QueueParams): Part[] {
	const states: ('open' | 'reviewed')[] = params.status === 'reviewed' ? ['reviewed'] : params.status === 'all' ? ['open', 'reviewed'] : ['open'];
	const verdicts: VerdictKey[] = params.status === 'needs-review' ? ['needs-review'] : ['needs-review', 'fail', 'pass', null];
	return states.flatMap((reviewState) =>
		verdicts.map((verdict) => ({ reviewState, verdict, group: (params.sort === 'queue' && verdict !== 'needs-review' ? 1 : 0) as 0 | 1 }))
	);
}

/** Assignment ids the course and assignment filters allow; null = no restriction, [] = nothing matches. */
async function allowedAssignments(params: QueueParams): Promise<number[] | null> {
	if (!params.course && !params.assignment) return null;
	const conditions = [params.course ? eq(courses.slug, params.course) : undefined, params.assignment ? eq(assignments.slug, params.assignment) : undefined];
	const rows = await db
		.select({ id: assignments.id })
		.from(assignments)
		.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(and(...conditions));
	return rows.map((r) => r.id);
}

function ageBounds(age: QueueParams['age'], now: Date): { from?: Date; until?: Date } {
	const ago = (days: number) => new Date(now.getTime() - days * DAY);
	if (age === 'today') return { from: ago(1) };
	if (age === 'week') return { from: ago(7), until: ago(1) };
	if (age === 'older') return { until: ago(7) };
	return {};
}

function partQuery(part: Part, filters: SQL[], cursor: QueueCursor | null, desc: boolean, limit: number): SQL | null {
	if (cursor && part.group < cursor.group) return null;
	const where = [
		sql`a.review_state = ${part.reviewState}`,
		part.verdict === null ? sql`a.verdict is null` : sql`a.verdict = ${part.verdict}`,
		sql`a.status in ('graded', 'error')`,
		...filters
	];
	if (cursor && part.group === cursor.group) {
		const t = sql`${cursor.createdAt}::timestamptz`;
		// the first half is an index condition; the second breaks ties within one microsecond by id
		where.push(desc ? sql`a.created_at <= ${t} and (a.created_at < ${t} or a.id < ${cursor.id})` : sql`a.created_at >= ${t} and (a.created_at > ${t} or a.id > ${cursor.id})`);
	}
	const order = desc ? sql`a.created_at desc, a.id desc` : sql`a.created_at asc, a.id asc`;
	return sql`(select a.id, a.created_at, ${part.group}::int as grp from attempts a where ${sql.join(where, sql` and `)} order by ${order} limit ${limit})`;
}

interface RawRow extends Record<string, unknown> {
	grp: number;
	id: string;
	cursor_time: string;
	status: AttemptStatus;
	verdict: AttemptVerdict | null;
	auto_verdict: AttemptVerdict | null;
	review_state: 'open' | 'reviewed';
	learner: string;
	assignment_slug: string;
	assignment_title: string;
	course_slug: string;
	course_title: string;
	last_frame: string | null;
	late: boolean;
}

/** `reviewerId`: the mentor asking; their own attempts (as a learner) are left out, since someone else reviews them. */
export async function fetchReviewQueue(params: QueueParams, reviewerId: string, now = new Date()): Promise<QueueAnswer> {
	const cursor = params.cursor ? decodeCursor(params.cursor, params.sort) : null;
	if (params.cursor && !cursor) return { ok: false, message: 'That page link has expired. Start from the first page.' };
	const allowed = await allowedAssignments(params);
	if (allowed && allowed.length === 0) return { ok: true, rows: [], nextCursor: null };

	const filters: SQL[] = [sql`a.user_id <> ${reviewerId}`];
	// a cohort narrows the queue to its members
	if (params.cohort) filters.push(sql`a.user_id in (select cm.user_id from cohort_members cm join cohorts co on co.id = cm.cohort_id where co.slug = ${params.cohort})`);
	if (allowed) filters.push(sql`a.assignment_id in (${sql.join(allowed.map((id) => sql`${id}`), sql`, `)})`);
	const { from, until } = ageBounds(params.age, now);
	if (from) filters.push(sql`a.created_at >= ${from.toISOString()}::timestamptz`);
	if (until) filters.push(sql`a.created_at < ${until.toISOString()}::timestamptz`);

	const desc = params.sort === 'newest';
	const take = params.limit + 1;
	const parts = partsFor(params)
		.map((p) => partQuery(p, filters, cursor, desc, take))
		.filter((q): q is SQL => q !== null);
	const order = desc ? sql`p.grp, p.created_at desc, p.id desc` : sql`p.grp, p.created_at asc, p.id asc`;

	const raw = (await db.execute(sql`
		select p.grp, p.id,
			to_char(p.created_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"') as cursor_time,
			a.status, a.verdict, a.auto_verdict, a.review_state,
			u.name as learner, s.slug as assignment_slug, s.title as assignment_title, c.slug as course_slug, c.title as course_title,
			(select f.name from attempt_frames f where f.attempt_id = a.id order by f.id desc limit 1) as last_frame,
			exists (select 1 from cohort_due_dates d join cohort_members cm on cm.cohort_id = d.cohort_id
				where cm.user_id = a.user_id and d.assignment_id = a.assignment_id and d.due_at < a.created_at) as late
		from (${sql.join(parts, sql` union all `)}) p
		join attempts a on a.id = p.id
		join users u on u.id = a.user_id
		join assignments s on s.id = a.assignment_id
		join lessons l on l.id = s.lesson_id
		join modules m on m.id = l.module_id
		join courses c on c.id = m.course_id
		order by ${order}
		limit ${take}
	`)) as unknown as RawRow[];

	const page = raw.slice(0, params.limit);
	const last = page.at(-1);
	const nextCursor =
		raw.length > params.limit && last ? encodeCursor({ sort: params.sort, group: last.grp as 0 | 1, createdAt: last.cursor_time, id: last.id }) : null;
	return {
		ok: true,
		nextCursor,
		rows: page.map((r) => ({
			id: r.id,
			href: `/mentor/attempts/${r.id}`,
			learner: r.learner,
			assignment: { slug: r.assignment_slug, title: r.assignment_title },
			course: { slug: r.course_slug, title: r.course_title },
			status: r.status,
			verdict: r.verdict,
			autoVerdict: r.auto_verdict,
			reviewState: r.review_state,
			createdAt: r.cursor_time,
			thumb: r.last_frame ? frameFileHref(r.id, r.last_frame, 'thumb') : null,
			late: Boolean(r.late)
		}))
	};
}

/** Courses and assignments for the queue's filter menus. */
export async function queueFilterOptions() {
	const rows = await db
		.select({ courseSlug: courses.slug, courseTitle: courses.title, slug: assignments.slug, title: assignments.title })
		.from(assignments)
		.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.orderBy(courses.title, modules.position, lessons.position, assignments.position);
	const courseList = [...new Map(rows.map((r) => [r.courseSlug, { slug: r.courseSlug, title: r.courseTitle }])).values()];
	return { courses: courseList, assignments: rows.map((r) => ({ slug: r.slug, title: r.title, course: r.courseSlug })), cohorts: await cohortOptions() };
}
