// The admin's payment forms: refunding one payment, with why (superforms + zod, both sides).
import { z } from 'zod';

export const refundSchema = z.object({
	paymentId: z.number({ error: 'Choose a payment to refund.' }).int('Choose a payment to refund.').positive('Choose a payment to refund.'),
	/** kept in the audit log */
	reason: z.string().trim().max(500, 'Keep the reason under 500 characters.').default('')
});
export type RefundForm = z.infer<typeof refundSchema>;
