// A mentor's review of an Attempt: numbered pins on a frame, the rubric and critique, and an audited verdict override.
import { and, eq, sql } from 'drizzle-orm';
import { db } from '../db/index';
import { assignments, attemptFrames, attempts, critiques, pins, users, verdictOverrides, verdicts, type AttemptVerdict } from '../db/schema';
import { cleanRubric, rubricFor } from '../grading/rubric';
import { recordAudit } from '../audit';
import { notifyAttemptSql } from '../attempts/events';
import { deliverSoon, recordCritique, recordVerdict } from '../learning-records/outbox';

export interface Mentor {
	id: string;
	email: string;
}

export type Saved<T = object> = ({ ok: true } & T) | { ok: false; status: 400 | 403 | 404 | 409; message: string; field?: 'text' | 'reason' };

/** Separation of duties: nobody reviews, pins, scores or overrides an attempt they submitted themselves. */
export const ownAttemptMessage = 'This is your own attempt: another mentor reviews it.';

const MAX_PIN_TEXT = 1000;
const MAX_CRITIQUE = 10_000;
const REVIEWABLE = ['graded', 'error'] as const;

async function reviewable(mentor: Mentor, attemptId: string, needsGraded = true): Promise<Saved> {
	const row = await db.query.attempts.findFirst({ where: eq(attempts.id, attemptId), columns: { status: true, userId: true } });
	if (!row) return { ok: false, status: 404, message: 'There is no such attempt.' };
	if (row.userId === mentor.id) return { ok: false, status: 403, message: ownAttemptMessage };
	if (!needsGraded) return { ok: true };
	if (!(REVIEWABLE as readonly string[]).includes(row.status)) return { ok: false, status: 409, message: 'This attempt is still being graded. Try again in a moment.' };
	return { ok: true };
}

export interface PinInput {
	frameName: string;
	x: number;
	y: number;
	text: string;
	/** made by the form once per pin: a second submit of the same pin finds the first */
	clientKey: string;
}

async function pinByKey(attemptId: string, clientKey: string) {
	return db.query.pins.findFirst({ where: and(eq(pins.attemptId, attemptId), eq(pins.clientKey, clientKey)), columns: { number: true } });
}

/**
 * Adds the next numbered pin; x and y are fractions 0–1 of the frame as shown. The same client key twice
 * (a double click, a resent form) gives the pin made the first time: the unique (attempt, key) index decides.
 */
export async function addPin(mentor: Mentor, attemptId: string, input: PinInput): Promise<Saved<{ number: number; repeated: boolean }>> {
	const text = input.text.trim();
	if (!text) return { ok: false, status: 400, message: 'Write what the pin should say.' };
	if (text.length > MAX_PIN_TEXT) return { ok: false, status: 400, message: `Keep a pin under ${MAX_PIN_TEXT} characters; put the rest in the critique.` };
	if (![input.x, input.y].every((v) => Number.isFinite(v) && v >= 0 && v <= 1)) return { ok: false, status: 400, message: 'Place the pin on the photo.' };
	const open = await reviewable(mentor, attemptId);
	if (!open.ok) return open;
	const frame = await db.query.attemptFrames.findFirst({ where: and(eq(attemptFrames.attemptId, attemptId), eq(attemptFrames.name, input.frameName)), columns: { id: true } });
	if (!frame) return { ok: false, status: 400, message: 'That frame is not part of this attempt.' };
	const earlier = await pinByKey(attemptId, input.clientKey);
	if (earlier) return { ok: true, number: earlier.number, repeated: true };
	// two mentors pinning at once: the unique (attempt, number) index makes one of them try the next number
	for (let tries = 0; tries < 3; tries++) {
		try {
			const [row] = await db
				.insert(pins)
				.values({
					attemptId,
					frameName: input.frameName,
					number: sql`(select coalesce(max(${pins.number}), 0) + 1 from ${pins} where ${pins.attemptId} = ${attemptId})`,
					x: input.x,
					y: input.y,
					text,
					mentorId: mentor.id,
					clientKey: input.clientKey
				})
				.onConflictDoNothing({ target: [pins.attemptId, pins.clientKey] })
				.returning({ number: pins.number });
			if (row) return { ok: true, number: row.number, repeated: false };
			// the same key was stored a moment ago by the other click
			const same = await pinByKey(attemptId, input.clientKey);
			if (same) return { ok: true, number: same.number, repeated: true };
		} catch (error) {
			if ((error as { code?: string }).code !== '23505' && (error as { cause?: { code?: string } }).cause?.code !== '23505') throw error;
		}
	}
	return { ok: false, status: 409, message: 'Another pin was added at the same moment. Please try again.' };
}

export async function removePin(mentor: Mentor, attemptId: string, pinId: number): Promise<Saved> {
	const allowed = await reviewable(mentor, attemptId, false);
	if (!allowed.ok) return allowed;
	const gone = await db.delete(pins).where(and(eq(pins.attemptId, attemptId), eq(pins.id, pinId))).returning({ id: pins.id });
	return gone.length ? { ok: true } : { ok: false, status: 404, message: 'That pin is already gone.' };
}

export interface ReviewInput {
	text: string;
	rubric: Record<string, unknown>;
	/** 'keep' leaves the verdict as it is */
	verdict: AttemptVerdict | 'keep';
	reason: string;
}

export interface ReviewSaved {
	first: boolean;
	verdict: AttemptVerdict | null;
	changed: boolean;
	learner: { email: string; name: string };
	assignment: string;
}

/**
 * Saves the critique and rubric, changes the verdict when asked (with a reason, kept in verdict_overrides),
 * and marks the attempt reviewed, all in one transaction.
 */
export async function saveReview(mentor: Mentor, attemptId: string, input: ReviewInput): Promise<Saved<ReviewSaved>> {
	const text = input.text.trim();
	const reason = input.reason.trim();
	if (!text) return { ok: false, status: 400, field: 'text', message: 'Write the critique before sending it.' };
	if (text.length > MAX_CRITIQUE) return { ok: false, status: 400, message: `The critique is over ${MAX_CRITIQUE} characters; please shorten it.` };
	if (input.verdict !== 'keep' && !(verdicts as readonly string[]).includes(input.verdict)) return { ok: false, status: 400, message: 'Choose a verdict from the list.' };

	const saved = await db.transaction(async (tx) => {
		const [row] = await tx
			.select({ learnerId: attempts.userId, verdict: attempts.verdict, status: attempts.status, reviewState: attempts.reviewState, spec: attempts.spec, result: attempts.result, email: users.email, name: users.name, assignment: assignments.title })
			.from(attempts)
			.innerJoin(users, eq(attempts.userId, users.id))
			.innerJoin(assignments, eq(attempts.assignmentId, assignments.id))
			.where(eq(attempts.id, attemptId))
			.for('update', { of: attempts });
		if (!row) return { ok: false, status: 404, message: 'There is no such attempt.' } as const;
		if (row.learnerId === mentor.id) return { ok: false, status: 403, message: ownAttemptMessage } as const;
		if (!(REVIEWABLE as readonly string[]).includes(row.status)) return { ok: false, status: 409, message: 'This attempt is still being graded. Try again in a moment.' } as const;
		const changed = input.verdict !== 'keep' && input.verdict !== row.verdict;
		if (changed && reason.length < 5) return { ok: false, status: 400, field: 'reason', message: 'Say why you change the verdict: the learner reads it, and it is kept on record.' } as const;

		// scored against the rubric of the spec this attempt was graded by
		const rubric = cleanRubric(input.rubric, rubricFor(row.spec));
		const now = new Date();
		await tx
			.insert(critiques)
			.values({ attemptId, mentorId: mentor.id, text, rubric })
			.onConflictDoUpdate({ target: critiques.attemptId, set: { mentorId: mentor.id, text, rubric, updatedAt: now } });
		const verdict = changed ? (input.verdict as AttemptVerdict) : row.verdict;
		// the learner's records: the first critique, and each changed verdict
		if (row.reviewState === 'open') await recordCritique(tx, attemptId, { mentorId: mentor.id, rubric }, now);
		if (changed) {
			const [override] = await tx
				.insert(verdictOverrides)
				.values({ attemptId, mentorId: mentor.id, mentorEmail: mentor.email, verdictBefore: row.verdict, verdictAfter: verdict!, reason })
				.returning({ id: verdictOverrides.id });
			const criteria = (row.result?.criteria ?? []) as { verdict: string }[];
			await recordVerdict(tx, attemptId, { verdict: verdict!, criteria: { passed: criteria.filter((c) => c.verdict === 'pass').length, total: criteria.length }, decidedBy: { kind: 'mentor', mentorId: mentor.id, overrideId: override.id } }, now);
			await recordAudit(tx, mentor, {
				action: 'verdict.override',
				subject: `${row.email}: ${row.assignment}`,
				detail: `${row.verdict ?? 'none'} → ${verdict}`,
				reason,
				href: `/mentor/attempts/${attemptId}`
			});
		}
		await tx.update(attempts).set({ verdict, reviewState: 'reviewed', reviewedAt: now }).where(eq(attempts.id, attemptId));
		await tx.execute(notifyAttemptSql(attemptId));
		return { ok: true, first: row.reviewState === 'open', verdict, changed, learner: { email: row.email, name: row.name }, assignment: row.assignment } as const;
	});
	if (saved.ok) deliverSoon();
	return saved;
}

