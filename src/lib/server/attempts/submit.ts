// Stores a new Attempt from an upload: files first, then the rows in one transaction, then the grading job.
import { randomUUID } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { db } from '../db/index';
import { attemptFrames, attempts } from '../db/schema';
import { decideAccess, guardedAssignment } from '../lessons/access';
import { fileStore } from '../storage/index';
import type { AuthUser } from '../auth';
import { findAssignment } from './assignment';
import { attemptFolder } from './keys';
import { queueGrading } from './queue';
import { deliverSoon, recordAttemptSubmitted } from '../learning-records/outbox';
import { planGateMessage } from '../shoot-plans/read';
import { lightPlanProblem, specWithStatedMotion } from './stated';
import { checkFrames, writeFrames, type FrameProblems } from './store-frames';
import type { UploadForm } from './upload-form';

export type SubmitResult =
	| { kind: 'created'; id: string }
	/** the same submission key again (a double click, a retried request): the attempt it already made */
	| { kind: 'duplicate'; id: string }
	| { kind: 'not-found' }
	| { kind: 'not-enrolled' }
	| { kind: 'invalid'; message: string; frames: FrameProblems }
	/** more files than the assignment has frames, or a file for a frame it does not have */
	| { kind: 'too-many-parts'; message: string }
	| { kind: 'unavailable'; message: string };

/** The attempt a submission key already made, if any. */
export async function existingAttemptId(userId: string, submissionKey: string): Promise<string | null> {
	const [row] = await db
		.select({ id: attempts.id })
		.from(attempts)
		.where(and(eq(attempts.userId, userId), eq(attempts.submissionKey, submissionKey)))
		.limit(1);
	return row?.id ?? null;
}

/** drizzle wraps driver errors with the whole query; the cause says what went wrong */
function describeError(error: unknown): string {
	const cause = (error as { cause?: unknown })?.cause;
	return cause instanceof Error ? cause.message : error instanceof Error ? error.message : String(error);
}

export async function submitAttempt(user: Pick<AuthUser, 'id' | 'roles'>, form: UploadForm): Promise<SubmitResult> {
	const assignment = await findAssignment(form.assignmentSlug);
	if (!assignment) return { kind: 'not-found' };
	if ((await decideAccess(user, guardedAssignment(assignment))) !== 'open') return { kind: 'not-enrolled' };
	const earlier = await existingAttemptId(user.id, form.submissionKey);
	if (earlier) return { kind: 'duplicate', id: earlier };
	if (!assignment.spec) {
		return { kind: 'unavailable', message: 'This assignment’s criteria are being fixed, so uploads are closed for now. Please try again later.' };
	}

	// the spec this Attempt keeps and is graded by: the Assignment's, with what the learner stated
	const spec = specWithStatedMotion(assignment.spec, form.stated);
	const planProblem = lightPlanProblem(assignment.spec, form.lightPlan);
	if (planProblem) return { kind: 'invalid', message: planProblem, frames: {} };
	const planGate = await planGateMessage(assignment.spec, user.id, assignment.id);
	if (planGate) return { kind: 'invalid', message: planGate, frames: {} };

	// no more parts than the assignment has frames: an extra file is refused by name, never silently dropped
	const extra = [...form.files.keys()].filter((name) => !assignment.spec!.frames.includes(name));
	if (extra.length > 0) {
		const names = assignment.spec.frames.map((f) => `“${f}”`).join(', ');
		const message = `This assignment takes ${assignment.spec.frames.length} frame${assignment.spec.frames.length === 1 ? '' : 's'} (${names}); the upload also carried ${extra.map((f) => `“${f}”`).join(', ')}. Nothing was stored; send only the assignment’s frames.`;
		return { kind: 'too-many-parts', message };
	}

	const { frames, problems } = await checkFrames(assignment.spec.frames, form.files);
	if (Object.keys(problems).length > 0) {
		return { kind: 'invalid', message: 'Some frames cannot be used. Nothing was stored; fix them and send again.', frames: problems };
	}

	const id = randomUUID();
	try {
		const stored = await writeFrames(id, frames);
		const inserted = await db.transaction(async (tx) => {
			const [row] = await tx
				.insert(attempts)
				.values({
					id,
					userId: user.id,
					assignmentId: assignment.id,
					submissionKey: form.submissionKey,
					spec,
					subjectBox: form.subjectBox,
					lightPlan: form.lightPlan,
					flashUsed: form.flashUsed
				})
				.onConflictDoNothing({ target: [attempts.userId, attempts.submissionKey] })
				.returning({ id: attempts.id });
			if (!row) return false;
			await tx.insert(attemptFrames).values(stored.map((f) => ({ attemptId: id, ...f })));
			await recordAttemptSubmitted(tx, user.id, assignment.id, id);
			return true;
		});
		if (!inserted) {
			// the twin request committed first: keep its attempt, drop these files
			await fileStore().deletePrefix(attemptFolder(id));
			const twin = await existingAttemptId(user.id, form.submissionKey);
			return twin ? { kind: 'duplicate', id: twin } : { kind: 'unavailable', message: 'Your upload could not be stored. Please send it again.' };
		}
	} catch (error) {
		console.error('[attempts] could not store an upload:', describeError(error));
		await fileStore().deletePrefix(attemptFolder(id)).catch(() => undefined);
		return { kind: 'unavailable', message: 'Your upload could not be stored just now, and nothing was kept. Please send it again.' };
	}

	// the attempt is safe now; a failed send is picked up by the worker's sweep for stranded attempts
	await queueGrading(id).catch((error: unknown) => console.error('[attempts] could not queue grading', error instanceof Error ? error.message : error));
	deliverSoon();
	return { kind: 'created', id };
}
