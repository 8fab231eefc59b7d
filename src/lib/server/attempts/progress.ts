// How close a learner's attempts came to the targets over time: each criterion's miss in stops, per attempt.
import { asc, eq, sql } from 'drizzle-orm';
import { db } from '../db/index';
import { assignments, attempts, courses, lessons, modules, type AttemptVerdict } from '../db/schema';
import type { CriterionResult } from '../grading/index';
import type { StoredResult } from './grade-job';
import { assignmentPath } from '$lib/attempts/paths';

/** Which colour a criterion belongs to on the chart: what the ambient does, or what the flash does. */
const FLASH_KINDS = new Set(['subject-lift', 'flash-evidence']);
const STOP_UNITS = new Set(['stops', 'EV', 's', 'f-number', 'ISO']);

/**
 * A value in stops on the criterion's own scale. Exposure settings are logarithmic (APEX, ASA PH2.5-1960):
 * time and ISO double per stop, the f-number grows by √2 per stop. Lengths and mireds are not exposure: null.
 */
function inStops(value: number, unit: CriterionResult['unit']): number | null {
	if (unit === 'stops' || unit === 'EV') return value;
	if (value <= 0) return null;
	if (unit === 's' || unit === 'ISO') return Math.log2(value);
	if (unit === 'f-number') return 2 * Math.log2(value);
	return null;
}

function missOne(measured: number, target: number, r: CriterionResult): number | null {
	const m = inStops(measured, r.unit);
	const t = inStops(target, r.unit);
	if (m === null || t === null) return null;
	switch (r.comparison) {
		case 'within':
			return Math.max(0, Math.abs(m - t) - (r.tolerance ?? 0));
		case 'at-least':
			return Math.max(0, t - m);
		case 'at-most':
			return Math.max(0, m - t);
		case 'between':
			return null;
	}
}

/** Stops outside what the criterion allows (0 = on target); null when it cannot be said in stops or was not measured. */
export function missInStops(r: CriterionResult): number | null {
	if (!STOP_UNITS.has(r.unit) || r.measured === null || r.target === null) return null;
	if (r.comparison === 'between' && Array.isArray(r.target) && typeof r.measured === 'number') {
		const [lo, hi] = r.target.map((t) => inStops(t, r.unit));
		const m = inStops(r.measured, r.unit);
		if (lo === null || hi === null || m === null) return null;
		return Math.max(0, lo - m, m - hi);
	}
	if (Array.isArray(r.measured) && Array.isArray(r.target)) {
		const misses = r.measured.map((m, i) => missOne(m, (r.target as number[])[i], r)).filter((v): v is number => v !== null);
		return misses.length ? Math.max(...misses) : null;
	}
	if (typeof r.measured === 'number' && typeof r.target === 'number') return missOne(r.measured, r.target, r);
	return null;
}

export interface ProgressPoint {
	id: string;
	at: string;
	assignment: string;
	assignmentSlug: string;
	/** the Assignment's page, where the learner sends another Attempt */
	assignmentHref: string;
	/** 1 for the learner's first Attempt at this Assignment, counting every Attempt sent */
	number: number;
	verdict: AttemptVerdict | null;
	/** the largest miss of the ambient criteria and of the flash criteria, in stops */
	ambientMiss: number | null;
	flashMiss: number | null;
	met: number;
	total: number;
}

export function summariseResult(criteria: readonly CriterionResult[]): Pick<ProgressPoint, 'ambientMiss' | 'flashMiss' | 'met' | 'total'> {
	let ambient: number | null = null;
	let flash: number | null = null;
	for (const r of criteria) {
		const miss = missInStops(r);
		if (miss === null) continue;
		if (FLASH_KINDS.has(r.kind)) flash = Math.max(flash ?? 0, miss);
		else ambient = Math.max(ambient ?? 0, miss);
	}
	return { ambientMiss: ambient, flashMiss: flash, met: criteria.filter((c) => c.verdict === 'pass').length, total: criteria.length };
}

/** Every graded attempt of the learner, oldest first. */
export async function loadProgress(userId: string): Promise<ProgressPoint[]> {
	const rows = await db
		.select({
			id: attempts.id,
			gradedAt: attempts.gradedAt,
			verdict: attempts.verdict,
			result: attempts.result,
			assignment: assignments.title,
			assignmentSlug: assignments.slug,
			lessonSlug: lessons.slug,
			courseSlug: courses.slug,
			// numbered before ungraded Attempts are left out, so "Attempt 3" matches the Assignment page's count
			number: sql<number>`row_number() over (partition by ${attempts.assignmentId} order by ${attempts.createdAt}, ${attempts.id})`.mapWith(Number)
		})
		.from(attempts)
		.innerJoin(assignments, eq(attempts.assignmentId, assignments.id))
		.innerJoin(lessons, eq(assignments.lessonId, lessons.id))
		.innerJoin(modules, eq(lessons.moduleId, modules.id))
		.innerJoin(courses, eq(modules.courseId, courses.id))
		.where(eq(attempts.userId, userId))
		.orderBy(asc(attempts.createdAt))
		.limit(500);
	return rows
		.filter((r) => r.gradedAt && r.result)
		.map((r) => ({
			id: r.id,
			at: r.gradedAt!.toISOString(),
			assignment: r.assignment,
			assignmentSlug: r.assignmentSlug,
			assignmentHref: assignmentPath(r.courseSlug, r.lessonSlug, r.assignmentSlug),
			number: r.number,
			verdict: r.verdict,
			...summariseResult(r.result!.criteria)
		}));
}
