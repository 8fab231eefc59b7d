// The learner's own billing: their payments with status, and their enrolments.
import { and, desc, eq } from 'drizzle-orm';
import { db } from '../db';
import { courses, enrolments, payments } from '../db/schema';
import { paymentReference } from './receipts';

export async function listBilling(userId: string) {
	const [paymentRows, enrolmentRows] = await Promise.all([
		db
			.select({
				id: payments.id,
				course: courses.title,
				courseSlug: courses.slug,
				amountCents: payments.amountCents,
				refundedCents: payments.refundedCents,
				currency: payments.currency,
				couponCode: payments.couponCode,
				status: payments.status,
				createdAt: payments.createdAt,
				paidAt: payments.paidAt,
				refundedAt: payments.refundedAt
			})
			.from(payments)
			.innerJoin(courses, eq(payments.courseId, courses.id))
			.where(eq(payments.userId, userId))
			.orderBy(desc(payments.createdAt), desc(payments.id)),
		db
			.select({ course: courses.title, courseSlug: courses.slug, status: enrolments.status, source: enrolments.source, createdAt: enrolments.createdAt })
			.from(enrolments)
			.innerJoin(courses, eq(enrolments.courseId, courses.id))
			.where(eq(enrolments.userId, userId))
			.orderBy(desc(enrolments.createdAt))
	]);
	return { payments: paymentRows, enrolments: enrolmentRows };
}

/** One receipt, only for its owner and only once money moved (a pending or cancelled checkout has none). */
export async function readReceipt(userId: string, paymentId: number) {
	const [row] = await db
		.select({ payment: payments, course: courses.title, courseSlug: courses.slug })
		.from(payments)
		.innerJoin(courses, eq(payments.courseId, courses.id))
		.where(and(eq(payments.id, paymentId), eq(payments.userId, userId)));
	if (!row || !row.payment.paidAt) return null;
	const p = row.payment;
	return {
		id: p.id,
		course: row.course,
		courseSlug: row.courseSlug,
		amountCents: p.amountCents,
		refundedCents: p.refundedCents,
		currency: p.currency,
		couponCode: p.couponCode,
		status: p.status,
		paidAt: p.paidAt,
		refundedAt: p.refundedAt,
		reference: paymentReference(p)
	};
}
