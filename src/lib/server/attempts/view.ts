// Everything the verdict page and the mentor's review page show about one Attempt, shaped for the browser.
import type { CriterionView } from '$lib/attempts/criterion-view';
import { asc, desc, eq } from 'drizzle-orm';
import { db } from '../db/index';
import { attemptFrames, attempts, critiques, pins, users, verdictOverrides, type AttemptStatus, type AttemptVerdict } from '../db/schema';
import { describeCriterion, rubricFor, rubricItem, validateSpec, type RubricItem } from '../grading/index';
import { canSeeAttempt, type Viewer } from './access';
import { findAssignmentById } from './assignment';
import { frameFileHref } from './files';
import { clippedCells, describeFlashUsed, evidenceRows, exifRows, formatMeasured, formatTargetOf, type ClippedCells, type ExifRow } from './format-result';
import type { StoredAnalysis, StoredResult } from './grade-job';
import { assignmentPath } from '$lib/attempts/paths';

export interface FrameView {
	name: string;
	large: string;
	thumb: string;
	original: string;
	exif: ExifRow[] | null;
	histogram: number[] | null;
	/** subject and background in stops from mid-grey */
	stops: { subject: number; background: number } | null;
	clipped: { highlights: number; shadows: number } | null;
	/** where the frame is clipped to white: the measuring grid's size and the cells a quarter or more clipped */
	clippedCells: ClippedCells | null;
	notes: string[];
	/** why the frame could not be read, when it could not */
	problem: string | null;
}

export interface PinView {
	id: number;
	number: number;
	frameName: string;
	x: number;
	y: number;
	text: string;
}

export interface AttemptView {
	id: string;
	status: AttemptStatus;
	verdict: AttemptVerdict | null;
	autoVerdict: AttemptVerdict | null;
	error: string | null;
	reviewState: 'open' | 'reviewed';
	createdAt: Date;
	gradedAt: Date | null;
	mine: boolean;
	learner: { name: string; email: string };
	assignment: { slug: string; title: string; uploadHref: string };
	lesson: { slug: string; title: string };
	course: { slug: string; title: string };
	subjectBox: { x: number; y: number; w: number; h: number };
	lightPlan: unknown;
	/** what the learner said they used, in words ('guide number 60, 1/4 power, 3 m from the subject'); null if nothing */
	flashUsed: string | null;
	frames: FrameView[];
	criteria: CriterionView[];
	critique: { text: string; rubric: Record<string, number>; mentor: string | null; updatedAt: Date } | null;
	pins: PinView[];
	/** what the mentor scores: the Assignment's rubric, plus any item scored under an earlier one */
	rubric: RubricItem[];
	overrides: { before: AttemptVerdict | null; after: AttemptVerdict; reason: string; mentor: string; at: Date }[];
}

function frameView(attemptId: string, row: typeof attemptFrames.$inferSelect): FrameView {
	const analysis = row.analysis;
	const frame = analysis?.ok ? analysis.frame : null;
	const pixels = frame?.pixels ?? null;
	return {
		name: row.name,
		large: frameFileHref(attemptId, row.name, 'large'),
		thumb: frameFileHref(attemptId, row.name, 'thumb'),
		original: frameFileHref(attemptId, row.name, 'original'),
		exif: frame ? exifRows(frame.exif) : null,
		histogram: pixels?.histogram ?? null,
		stops: pixels ? { subject: pixels.subject.stops, background: pixels.background.stops } : null,
		clipped: pixels ? { highlights: pixels.clippedHighlights, shadows: pixels.clippedShadows } : null,
		clippedCells: pixels ? clippedCells(pixels.grid) : null,
		notes: frame?.notes ?? [],
		problem: analysis && !analysis.ok ? analysis.message : null
	};
}

function criteriaView(spec: unknown, result: StoredResult | null): CriterionView[] {
	if (!result) return [];
	const checked = validateSpec(spec);
	return result.criteria.map((r, i) => ({
		kind: r.kind,
		verdict: r.verdict,
		asked: checked.ok && checked.spec.criteria[i] ? describeCriterion(checked.spec.criteria[i]) : r.kind,
		measured: formatMeasured(r),
		target: formatTargetOf(r),
		message: r.message,
		evidence: evidenceRows(r)
	}));
}

/**
 * The attempt as `viewer` may see it, or null (missing, or not theirs: the same answer). Pins and the
 * critique reach the learner only once the mentor has sent the review; mentors always see them.
 */
export async function loadAttemptView(viewer: Viewer, attemptId: string): Promise<AttemptView | null> {
	const [row] = await db
		.select({ attempt: attempts, learnerName: users.name, learnerEmail: users.email })
		.from(attempts)
		.innerJoin(users, eq(attempts.userId, users.id))
		.where(eq(attempts.id, attemptId))
		.limit(1);
	if (!row || !canSeeAttempt(viewer, row.attempt.userId)) return null;
	const a = row.attempt;
	const assignment = await findAssignmentById(a.assignmentId);
	if (!assignment) return null;
	const mine = a.userId === viewer.id;
	const showReview = a.reviewState === 'reviewed' || !mine;

	const [frameRows, critiqueRows, pinRows, overrideRows] = await Promise.all([
		db.select().from(attemptFrames).where(eq(attemptFrames.attemptId, a.id)).orderBy(asc(attemptFrames.id)),
		showReview
			? db
					.select({ critique: critiques, mentor: users.name })
					.from(critiques)
					.leftJoin(users, eq(critiques.mentorId, users.id))
					.where(eq(critiques.attemptId, a.id))
			: Promise.resolve([]),
		showReview ? db.select().from(pins).where(eq(pins.attemptId, a.id)).orderBy(asc(pins.number)) : Promise.resolve([]),
		db.select().from(verdictOverrides).where(eq(verdictOverrides.attemptId, a.id)).orderBy(desc(verdictOverrides.createdAt))
	]);
	const critique = critiqueRows[0];
	const rubric = rubricFor(a.spec);
	for (const id of Object.keys(critique?.critique.rubric ?? {})) {
		const item = rubricItem(id);
		if (item && !rubric.some((r) => r.id === id)) rubric.push(item);
	}
	return {
		id: a.id,
		status: a.status,
		verdict: a.verdict,
		autoVerdict: a.autoVerdict,
		error: a.error,
		reviewState: a.reviewState,
		createdAt: a.createdAt,
		gradedAt: a.gradedAt,
		mine,
		learner: { name: row.learnerName, email: row.learnerEmail },
		assignment: { slug: assignment.slug, title: assignment.title, uploadHref: assignmentPath(assignment.course.slug, assignment.lesson.slug, assignment.slug) },
		lesson: assignment.lesson,
		course: { slug: assignment.course.slug, title: assignment.course.title },
		subjectBox: a.subjectBox,
		lightPlan: a.lightPlan,
		flashUsed: describeFlashUsed(a.flashUsed),
		frames: frameRows.map((f) => frameView(a.id, f)),
		criteria: criteriaView(a.spec, a.result),
		critique: critique ? { text: critique.critique.text, rubric: critique.critique.rubric, mentor: critique.mentor, updatedAt: critique.critique.updatedAt } : null,
		pins: pinRows.map((p) => ({ id: p.id, number: p.number, frameName: p.frameName, x: p.x, y: p.y, text: p.text })),
		rubric,
		// the learner sees why their verdict changed only with the review itself
		overrides: showReview ? overrideRows.map((o) => ({ before: o.verdictBefore, after: o.verdictAfter, reason: o.reason, mentor: mine ? 'your mentor' : o.mentorEmail, at: o.createdAt })) : []
	};
}
