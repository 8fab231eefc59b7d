// Audit lines for payment actions that happen at the provider first (a refund): written once the action went through.
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { courses, payments, users } from '../db/schema';
import { recordAudit, type Actor } from '../audit';
import { formatPrice } from '../../format';

export async function auditRefund(actor: Actor, paymentId: number, reason: string): Promise<void> {
	const [row] = await db
		.select({ email: users.email, course: courses.title, amountCents: payments.amountCents, currency: payments.currency })
		.from(payments)
		.innerJoin(users, eq(payments.userId, users.id))
		.innerJoin(courses, eq(payments.courseId, courses.id))
		.where(eq(payments.id, paymentId));
	if (!row) return;
	await recordAudit(db, actor, {
		action: 'payment.refund',
		subject: `${row.email} in ${row.course}`,
		detail: `payment ${paymentId}: ${formatPrice(row.amountCents, row.currency)} refunded`,
		reason: reason.trim().slice(0, 500),
		href: `/admin/payments?q=${encodeURIComponent(row.email)}`
	});
}
