// Writes to enrolments: open access for a payment or by hand, and close it only when nothing still pays for it.
import { and, eq, ne, sql } from 'drizzle-orm';
import type { Db } from '../db';
import { enrolments, payments, type Enrolment } from '../db/schema';

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
type Runner = Db | Tx;

/**
 * One learner and course at a time: two payments settling, or a refund beside a completion, must each see what
 * the other committed before deciding whether access stays open (held until the transaction ends).
 */
export async function lockEnrolment(tx: Tx, userId: string, courseId: number): Promise<void> {
	await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`stopwise-enrolment:${userId}:${courseId}`}))`);
}

/**
 * Active enrolment for the learner in the course, whatever was there before (none, revoked, or active).
 * The unique (user, course) index means a replay or a race can never make a second row. A grant ('admin' or
 * 'free') is remembered in `grantedAt`; a payment on top of a grant keeps the grant and its source.
 */
export async function activateEnrolment(
	tx: Runner,
	input: { userId: string; courseId: number; source: Enrolment['source']; paymentId: number | null; couponCode?: string | null }
): Promise<void> {
	const grant = input.source !== 'payment';
	const couponCode = input.couponCode ?? null;
	await tx
		.insert(enrolments)
		.values({ ...input, couponCode, status: 'active', grantedAt: grant ? sql`now()` : null })
		.onConflictDoUpdate({
			target: [enrolments.userId, enrolments.courseId],
			set: grant
				? { status: 'active', source: input.source, couponCode, grantedAt: sql`now()`, revokedAt: null }
				: {
						status: 'active',
						source: sql`case when ${enrolments.grantedAt} is null then 'payment' else ${enrolments.source} end`,
						paymentId: input.paymentId,
						revokedAt: null
					}
		});
}

/**
 * After a payment was fully refunded: access stays while another payment for the same course is still paid (it
 * becomes the enrolment's payment) or an admin granted it; otherwise it closes. Call under `lockEnrolment`.
 */
export async function revokeUnlessStillPaid(tx: Tx, refunded: { id: number; userId: string; courseId: number }): Promise<boolean> {
	const [other] = await tx
		.select({ id: payments.id })
		.from(payments)
		.where(
			and(
				eq(payments.userId, refunded.userId),
				eq(payments.courseId, refunded.courseId),
				eq(payments.status, 'paid'),
				ne(payments.id, refunded.id)
			)
		)
		.limit(1);
	const mine = and(eq(enrolments.userId, refunded.userId), eq(enrolments.courseId, refunded.courseId));
	if (other) {
		await tx.update(enrolments).set({ paymentId: other.id }).where(and(mine, eq(enrolments.paymentId, refunded.id)));
		return false;
	}
	const rows = await tx
		.update(enrolments)
		.set({ status: 'revoked', revokedAt: sql`now()` })
		.where(and(mine, eq(enrolments.status, 'active'), sql`${enrolments.grantedAt} is null`))
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
