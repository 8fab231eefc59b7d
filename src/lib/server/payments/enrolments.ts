// Writes to enrolments: open access for a payment or by hand, and close it again; one row per learner and course.
import { and, eq, sql } from 'drizzle-orm';
import type { Db } from '../db';
import { enrolments, type Enrolment } from '../db/schema';

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type Runner = Db | Tx;

/**
 * Active enrolment for the learner in the course, whatever was there before (none, revoked, or active).
 * The unique (user, course) index means a replay or a race can never make a second row.
 */
export async function activateEnrolment(
	tx: Runner,
	input: { userId: string; courseId: number; source: Enrolment['source']; paymentId: number | null; couponCode?: string | null }
): Promise<void> {
	const couponCode = input.couponCode ?? null;
	await tx
		.insert(enrolments)
		.values({ ...input, couponCode, status: 'active' })
		.onConflictDoUpdate({
			target: [enrolments.userId, enrolments.courseId],
			set: { status: 'active', source: input.source, paymentId: input.paymentId, couponCode, revokedAt: null }
		});
}

/** Revokes the enrolment that this payment opened; one opened by hand or by a later payment stays. */
export async function revokeEnrolmentOfPayment(tx: Runner, paymentId: number): Promise<boolean> {
	const rows = await tx
		.update(enrolments)
		.set({ status: 'revoked', revokedAt: sql`now()` })
		.where(and(eq(enrolments.paymentId, paymentId), eq(enrolments.status, 'active')))
		.returning({ id: enrolments.id });
	return rows.length > 0;
}

export async function isEnrolled(tx: Runner, userId: string, courseId: number): Promise<boolean> {
	const [row] = await tx
		.select({ id: enrolments.id })
		.from(enrolments)
		.where(and(eq(enrolments.userId, userId), eq(enrolments.courseId, courseId), eq(enrolments.status, 'active')))
		.limit(1);
	return Boolean(row);
}
