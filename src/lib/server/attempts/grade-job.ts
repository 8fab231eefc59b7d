// Grades one Attempt exactly once: reads its originals, grades, and stores the result only if no other run did.
import { and, eq, ne, sql } from 'drizzle-orm';
import { DrizzleError } from 'drizzle-orm';
import { db } from '../db/index';
import { attemptFrames, attempts, type AttemptFrame } from '../db/schema';
import { readFrame, type Box, type Frame } from '../analysis/index';
import { grade, SpecValidationError, type AssignmentSpecInput, type CriterionResult } from '../grading/index';
import { fileStore } from '../storage/index';
import { notifyAttemptSql } from './events';
import { maxUploadBytes } from './limits';
import { deliverSoon, recordVerdict } from '../learning-records/outbox';

export type { StoredAnalysis, StoredResult } from '../db/json-types';
import type { StoredAnalysis, StoredResult } from '../db/json-types';

export interface GradeOptions {
	/** Called after the frames are read and before the result is stored (tests interrupt a run here). */
	checkpoint?: () => void | Promise<void>;
}

export type GradeOutcome = 'graded' | 'already-graded' | 'missing' | 'spec-error';

async function readOne(row: AttemptFrame, subject: Box): Promise<StoredAnalysis> {
	const bytes = await fileStore().get(row.originalKey);
	if (!bytes) return { ok: false, message: 'The uploaded file is missing from storage, so this frame could not be read.' };
	try {
		return { ok: true, frame: await readFrame(bytes, { subject, limits: { maxBytes: maxUploadBytes() } }) };
	} catch (error) {
		// readFrame rejects only with FrameReadError, whose message is written for the learner
		return { ok: false, message: error instanceof Error ? error.message : 'This frame could not be read.' };
	}
}

class AlreadyGraded extends Error {}

/**
 * One grading run. Safe to run twice at once or again after a crash: the run that stores the result is the
 * one whose conditional UPDATE (status <> 'graded') wins, in the same transaction as the frame analyses.
 */
export async function gradeAttempt(attemptId: string, options: GradeOptions = {}): Promise<GradeOutcome> {
	const [claimed] = await db
		.update(attempts)
		.set({ status: 'grading', gradeRuns: sql`${attempts.gradeRuns} + 1` })
		.where(and(eq(attempts.id, attemptId), ne(attempts.status, 'graded')))
		.returning({ spec: attempts.spec, subjectBox: attempts.subjectBox, flashUsed: attempts.flashUsed });
	if (!claimed) {
		const exists = await db.query.attempts.findFirst({ where: eq(attempts.id, attemptId), columns: { id: true } });
		return exists ? 'already-graded' : 'missing';
	}
	await db.execute(notifyAttemptSql(attemptId));

	const rows = await db.select().from(attemptFrames).where(eq(attemptFrames.attemptId, attemptId));
	const analyses = new Map<string, StoredAnalysis>();
	for (const row of rows) analyses.set(row.name, await readOne(row, claimed.subjectBox));
	await options.checkpoint?.();

	const frames: Record<string, Frame> = {};
	for (const [name, a] of analyses) if (a.ok) frames[name] = a.frame;
	let result;
	try {
		// the spec as stored with the attempt; grade() validates it again and throws SpecValidationError if broken
		result = grade(claimed.spec, frames, { used: claimed.flashUsed ?? undefined });
	} catch (error) {
		if (!(error instanceof SpecValidationError)) throw error;
		// a broken spec will not mend on retry: say so and hand the attempt to a mentor
		await db
			.update(attempts)
			.set({ status: 'error', error: 'This assignment’s criteria could not be read, so the attempt was not graded automatically. A mentor will look at it.' })
			.where(and(eq(attempts.id, attemptId), ne(attempts.status, 'graded')));
		return 'spec-error';
	}

	try {
		await db.transaction(async (tx) => {
			const [won] = await tx
				.update(attempts)
				.set({
					status: 'graded',
					autoVerdict: result.verdict,
					// a mentor's earlier decision stands
					verdict: sql`coalesce(${attempts.verdict}, ${result.verdict})`,
					result: { criteria: result.criteria } satisfies StoredResult,
					error: null,
					gradedAt: new Date()
				})
				.where(and(eq(attempts.id, attemptId), ne(attempts.status, 'graded')))
				.returning({ id: attempts.id });
			if (!won) throw new AlreadyGraded();
			for (const row of rows) {
				const analysis = analyses.get(row.name)!;
				const pixels = analysis.ok ? analysis.frame.pixels : null;
				await tx
					.update(attemptFrames)
					.set({ analysis, width: pixels?.width ?? row.width, height: pixels?.height ?? row.height })
					.where(eq(attemptFrames.id, row.id));
			}
			await recordVerdict(tx, attemptId, {
				verdict: result.verdict,
				criteria: { passed: result.criteria.filter((c) => c.verdict === 'pass').length, total: result.criteria.length },
				decidedBy: { kind: 'grading' }
			});
			await tx.execute(notifyAttemptSql(attemptId));
		});
	} catch (error) {
		if (error instanceof AlreadyGraded) return 'already-graded';
		if (error instanceof DrizzleError && error.cause instanceof AlreadyGraded) return 'already-graded';
		throw error;
	}
	deliverSoon();
	return 'graded';
}

/** After the last retry failed: the attempt goes to a mentor with a plain message (never left "grading"). */
export async function markGradingFailed(attemptId: string): Promise<void> {
	await db.transaction(async (tx) => {
		const [row] = await tx
			.update(attempts)
			.set({ status: 'error', error: 'Grading failed several times on our side, so there is no automatic verdict. A mentor will look at this attempt.' })
			.where(and(eq(attempts.id, attemptId), ne(attempts.status, 'graded')))
			.returning({ id: attempts.id });
		if (row) await tx.execute(notifyAttemptSql(attemptId));
	});
}
