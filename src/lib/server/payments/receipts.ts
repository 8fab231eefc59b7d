// Receipts and refund notices: what one payment looked like, sent by e-mail after the change that caused it.
import { eq } from 'drizzle-orm';
import { formatPrice } from '../../format';
import { db } from '../db';
import { courses, payments, users } from '../db/schema';
import { sendInBackground, sendLetter } from '../mail';
import { receiptLetter, refundLetter } from '../mail-letters';
import type { Settled } from './settle';
import { isEnrolled } from './enrolments';

const dateFormat = new Intl.DateTimeFormat('en', { dateStyle: 'long', timeStyle: 'short', timeZone: 'UTC' });

export async function readPaymentFacts(paymentId: number) {
	const [row] = await db
		.select({ payment: payments, email: users.email, name: users.name, course: courses.title, courseSlug: courses.slug })
		.from(payments)
		.innerJoin(users, eq(payments.userId, users.id))
		.innerJoin(courses, eq(payments.courseId, courses.id))
		.where(eq(payments.id, paymentId));
	return row ?? null;
}

/** The reference a learner quotes: the provider's payment id once paid, else the checkout session's. */
export function paymentReference(p: { paymentIntentId: string | null; checkoutSessionId: string }): string {
	return p.paymentIntentId ?? p.checkoutSessionId;
}

/** Sends the e-mail a settlement calls for; a mail failure is logged by sendLetter and never undoes the payment. */
export async function notifySettled(settled: Settled, origin: string): Promise<void> {
	if (settled.change !== 'paid' && settled.change !== 'refunded' && settled.change !== 'paid-then-refunded') return;
	const facts = await readPaymentFacts(settled.paymentId);
	if (!facts) return;
	const { payment } = facts;
	const href = `${origin}/account/billing`;
	const reference = paymentReference(payment);
	if (settled.change === 'paid') {
		await sendLetter(
			receiptLetter(facts.email, facts.name, {
				course: facts.course,
				amount: formatPrice(payment.amountCents, payment.currency),
				paidAt: `${dateFormat.format(payment.paidAt ?? new Date())} UTC`,
				reference,
				coupon: payment.couponCode,
				href
			})
		);
		return;
	}
	const refunded = payment.refundedCents || payment.amountCents;
	const accessKept = await isEnrolled(db, payment.userId, payment.courseId);
	await sendLetter(refundLetter(facts.email, facts.name, { course: facts.course, amount: formatPrice(refunded, payment.currency), reference, href, accessKept }));
}

/** The same, without making the caller wait: a slow mail server must not hold up a page or the provider's webhook. */
export function mailSettlement(settled: Settled, origin: string): void {
	sendInBackground('payment notification', () => notifySettled(settled, origin));
}
