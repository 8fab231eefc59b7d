// A learner's attempts at one assignment (resubmissions kept), the live status of one attempt, and the lesson's cards.
import { and, desc, eq, inArray, isNotNull } from 'drizzle-orm';
import { db } from '../db/index';
import { attemptFrames, attempts, type Assignment, type AttemptStatus, type AttemptVerdict } from '../db/schema';
import { decideAccess } from '../lessons/access';
import { describeCriterion, validateSpec } from '../grading/index';
import type { AuthUser } from '../auth';
import { canSeeAttempt, type Viewer } from './access';
import { frameFileHref } from './files';
import type { AssignmentCard } from '../../lessons/page-data';
import { assignmentPath } from '$lib/attempts/paths';

export interface AttemptSummary {
	id: string;
	status: AttemptStatus;
	verdict: AttemptVerdict | null;
	reviewState: 'open' | 'reviewed';
	createdAt: Date;
	gradedAt: Date | null;
	thumb: string | null;
}

/** Newest first. The thumbnail is the last frame's (the lit frame, in most specs). */
export async function listAttemptsFor(userId: string, assignmentId: number): Promise<AttemptSummary[]> {
	const rows = await db
		.select({
			id: attempts.id,
			status: attempts.status,
			verdict: attempts.verdict,
			reviewState: attempts.reviewState,
			createdAt: attempts.createdAt,
			gradedAt: attempts.gradedAt
		})
		.from(attempts)
		.where(and(eq(attempts.userId, userId), eq(attempts.assignmentId, assignmentId)))
		.orderBy(desc(attempts.createdAt))
		.limit(200);
	if (rows.length === 0) return [];
	const frames = await db
		.select({ attemptId: attemptFrames.attemptId, name: attemptFrames.name, id: attemptFrames.id })
		.from(attemptFrames)
		.where(inArray(attemptFrames.attemptId, rows.map((r) => r.id)));
	const last = new Map<string, { name: string; id: number }>();
	for (const f of frames) if ((last.get(f.attemptId)?.id ?? -1) < f.id) last.set(f.attemptId, f);
	return rows.map((r) => {
		const frame = last.get(r.id);
		return { ...r, thumb: frame ? frameFileHref(r.id, frame.name, 'thumb') : null };
	});
}

export interface AttemptStatusView {
	id: string;
	status: AttemptStatus;
	verdict: AttemptVerdict | null;
	reviewState: 'open' | 'reviewed';
	error: string | null;
	gradedAt: string | null;
}

/** The live status the verdict page polls for; null when missing or not the viewer's to see. */
export async function readAttemptStatus(viewer: Viewer, attemptId: string): Promise<AttemptStatusView | null> {
	const [row] = await db
		.select({ id: attempts.id, userId: attempts.userId, status: attempts.status, verdict: attempts.verdict, reviewState: attempts.reviewState, error: attempts.error, gradedAt: attempts.gradedAt })
		.from(attempts)
		.where(eq(attempts.id, attemptId))
		.limit(1);
	if (!row || !canSeeAttempt(viewer, row.userId)) return null;
	const { userId: _owner, gradedAt, ...rest } = row;
	return { ...rest, gradedAt: gradedAt?.toISOString() ?? null };
}


/** The Assignment cards of one lesson: criteria in plain words, the viewer's last verdict, and where to upload. */
export async function lessonAssignmentCards(
	user: Pick<AuthUser, 'id' | 'roles'> | null,
	place: { courseId: number; courseSlug: string; lessonSlug: string },
	list: readonly Pick<Assignment, 'id' | 'slug' | 'title' | 'brief' | 'spec'>[]
): Promise<AssignmentCard[]> {
	if (list.length === 0) return [];
	const [access, latest] = await Promise.all([
		decideAccess(user, { courseId: place.courseId, courseSlug: place.courseSlug, free: false }),
		user ? latestVerdicts(user.id, list.map((a) => a.id)) : Promise.resolve(new Map<number, { verdict: string; at: string }>())
	]);
	return list.map((a) => {
		const checked = validateSpec(a.spec);
		return {
			slug: a.slug,
			title: a.title,
			brief: a.brief,
			frames: checked.ok ? checked.spec.frames : [],
			criteria: checked.ok ? checked.spec.criteria.map(describeCriterion) : [],
			lastVerdict: latest.get(a.id) ?? null,
			uploadHref: access === 'open' ? assignmentPath(place.courseSlug, place.lessonSlug, a.slug) : null
		};
	});
}

async function latestVerdicts(userId: string, assignmentIds: number[]): Promise<Map<number, { verdict: string; at: string }>> {
	const rows = await db
		.selectDistinctOn([attempts.assignmentId], { assignmentId: attempts.assignmentId, verdict: attempts.verdict, gradedAt: attempts.gradedAt, createdAt: attempts.createdAt })
		.from(attempts)
		.where(and(eq(attempts.userId, userId), inArray(attempts.assignmentId, assignmentIds), isNotNull(attempts.verdict)))
		.orderBy(attempts.assignmentId, desc(attempts.createdAt));
	return new Map(rows.map((r) => [r.assignmentId, { verdict: r.verdict!, at: (r.gradedAt ?? r.createdAt).toISOString() }]));
}
