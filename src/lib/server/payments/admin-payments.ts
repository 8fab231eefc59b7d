// Admin's payments table (filters from URL params) and refunds through the provider.
import { and, count, desc, eq, gte, ilike, lt, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import { db } from '../db';
import { courses, paymentStatuses, payments, users } from '../db/schema';
import { isEnrolled } from './enrolments';
import { mailSettlement } from './receipts';
import { settleChargeRefunded, type Settled } from './settle';
import { getStripe, isStripeError, type Stripe } from './stripe';

export const paymentsPageSize = 25;

const day = z
	.string()
	.regex(/^\d{4}-\d{2}-\d{2}$/)
	// a real calendar day: 2026-02-30 would otherwise roll over into March
	.refine((s) => {
		const t = Date.parse(`${s}T00:00:00Z`);
		return !Number.isNaN(t) && new Date(t).toISOString().slice(0, 10) === s;
	})
	.catch('');

/** URL params of the payments table; anything malformed falls back to "no filter" instead of failing. */
export const paymentsQuerySchema = z.object({
	status: z.enum(paymentStatuses).or(z.literal('')).catch(''),
	course: z.string().trim().max(100).catch(''),
	q: z.string().trim().max(100).catch(''),
	from: day,
	to: day,
	page: z.coerce.number().int().min(1).max(100_000).catch(1)
});
export type PaymentsQuery = z.infer<typeof paymentsQuerySchema>;

export function readPaymentsQuery(params: URLSearchParams): PaymentsQuery {
	const pick = (k: string) => params.get(k) ?? undefined;
	return paymentsQuerySchema.parse({ status: pick('status'), course: pick('course'), q: pick('q'), from: pick('from'), to: pick('to'), page: pick('page') });
}

export function escapeLike(s: string): string {
	return s.replace(/[\\%_]/g, (c) => `\\${c}`);
}

export async function listPayments(query: PaymentsQuery) {
	const filters: SQL[] = [];
	if (query.status) filters.push(eq(payments.status, query.status));
	if (query.course) filters.push(eq(courses.slug, query.course));
	if (query.q) filters.push(ilike(users.email, `%${escapeLike(query.q)}%`));
	if (query.from) filters.push(gte(payments.createdAt, new Date(`${query.from}T00:00:00Z`)));
	// "to" is a whole day: everything before the next midnight (UTC)
	if (query.to) filters.push(lt(payments.createdAt, new Date(Date.parse(`${query.to}T00:00:00Z`) + 86_400_000)));
	const where = and(...filters);
	const [rows, [{ total }], courseList] = await Promise.all([
		db
			.select({
				id: payments.id,
				email: users.email,
				name: users.name,
				course: courses.title,
				courseSlug: courses.slug,
				amountCents: payments.amountCents,
				refundedCents: payments.refundedCents,
				currency: payments.currency,
				couponCode: payments.couponCode,
				status: payments.status,
				reference: payments.paymentIntentId,
				createdAt: payments.createdAt,
				paidAt: payments.paidAt,
				refundedAt: payments.refundedAt
			})
			.from(payments)
			.innerJoin(users, eq(payments.userId, users.id))
			.innerJoin(courses, eq(payments.courseId, courses.id))
			.where(where)
			.orderBy(desc(payments.createdAt), desc(payments.id))
			.limit(paymentsPageSize)
			.offset((query.page - 1) * paymentsPageSize),
		db
			.select({ total: count() })
			.from(payments)
			.innerJoin(users, eq(payments.userId, users.id))
			.innerJoin(courses, eq(payments.courseId, courses.id))
			.where(where),
		db.select({ slug: courses.slug, title: courses.title }).from(courses).orderBy(courses.title)
	]);
	return { payments: rows, total, pages: Math.max(1, Math.ceil(total / paymentsPageSize)), courses: courseList };
}

export type RefundResult = { ok: true; message: string } | { ok: false; message: string };

/**
 * Refunds the whole remaining amount at the provider, then applies the refunded charge at once (the webhook that
 * follows finds it applied and changes nothing): the admin sees the result on reload, access closes now.
 */
export async function refundPayment(paymentId: number, origin: string): Promise<RefundResult> {
	const payment = await db.query.payments.findFirst({ where: eq(payments.id, paymentId) });
	if (!payment) return { ok: false, message: 'That payment does not exist.' };
	if (payment.status !== 'paid' || !payment.paymentIntentId) {
		return { ok: false, message: `Only paid payments can be refunded; this one is ${payment.status}.` };
	}
	const stripe = getStripe();
	if (!stripe) return { ok: false, message: 'Payments are not set up on this server (no STRIPE_SECRET_KEY).' };
	try {
		await stripe.refunds.create(
			{ payment_intent: payment.paymentIntentId, reason: 'requested_by_customer', metadata: { paymentId: String(payment.id) } },
			// a double-submitted refund form is one refund
			{ idempotencyKey: `stopwise-refund-${payment.id}-${payment.paymentIntentId}` }
		);
	} catch (e) {
		if (!(isStripeError(e) && e.code === 'charge_already_refunded')) {
			console.error('[payments] refund failed', isStripeError(e) ? `${e.type} ${e.statusCode}: ${e.message}` : e);
			return { ok: false, message: `The payment service refused the refund: ${isStripeError(e) ? e.message : 'it could not be reached'}. Nothing changed.` };
		}
	}
	const settled = await applyRefundedCharge(stripe, payment.paymentIntentId);
	mailSettlement(settled, origin);
	// the webhook may have applied the refund first; what counts is the payment's state now
	const now = await db.query.payments.findFirst({ where: eq(payments.id, payment.id), columns: { status: true } });
	if (settled.change === 'refunded' || now?.status === 'refunded') {
		if (await isEnrolled(db, payment.userId, payment.courseId)) {
			return { ok: true, message: 'Refunded. The learner keeps access: another payment or a grant still covers this course. They get an e-mail.' };
		}
		return { ok: true, message: 'Refunded. The learner no longer has access to the members-only lessons and gets an e-mail.' };
	}
	return { ok: true, message: 'Refund sent. Access closes when the payment service confirms it, usually within seconds.' };
}

async function applyRefundedCharge(stripe: Stripe, intentId: string): Promise<Settled> {
	try {
		const intent = await stripe.paymentIntents.retrieve(intentId, { expand: ['latest_charge'] });
		const charge = intent.latest_charge;
		if (!charge || typeof charge === 'string') return { change: 'none', reason: 'no charge on the intent' };
		return await db.transaction((tx) => settleChargeRefunded(tx, charge));
	} catch (e) {
		// the refund itself went through; its webhook will apply it
		console.error('[payments] could not apply a refund at once; waiting for the webhook', e instanceof Error ? e.message : e);
		return { change: 'none', reason: 'left to the webhook' };
	}
}
