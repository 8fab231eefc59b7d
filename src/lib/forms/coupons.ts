// The admin's coupon forms: a new coupon and a change to one (superforms + zod, both sides).
import { z } from 'zod';

/** A calendar day typed in a date field, or empty for "never". */
const day = z
	.string()
	.trim()
	.refine((s) => s === '' || (/^\d{4}-\d{2}-\d{2}$/.test(s) && new Date(`${s}T00:00:00Z`).toISOString().slice(0, 10) === s), 'Pick a date, or leave it empty for no end.')
	.default('');

const percentOff = z.number({ error: 'Give the discount in whole percent.' }).int('Give the discount in whole percent.').min(1, 'At least 1 % off.').max(100, 'At most 100 % off.');
/** 0 or empty means no limit; the form shows an empty field as "no limit". */
const maxUses = z.number({ error: 'Give the number of uses as a whole number.' }).int('Give the number of uses as a whole number.').min(0, 'Use 0 for no limit.').max(1_000_000);
const note = z.string().trim().max(200, 'Keep the note under 200 characters.').default('');

export const newCouponSchema = z.object({
	code: z
		.string()
		.transform((s) => s.replace(/\s+/g, '').toUpperCase())
		.pipe(z.string().regex(/^[A-Z0-9_-]{2,40}$/, 'Use 2–40 letters, digits, - or _ (it is stored in capitals).')),
	percentOff,
	maxUses: maxUses.default(0),
	lastDay: day,
	note
});
export type NewCouponForm = z.infer<typeof newCouponSchema>;

export const changeCouponSchema = z.object({
	percentOff,
	maxUses: maxUses.default(0),
	lastDay: day,
	/** an unticked box sends nothing: missing means switched off */
	active: z.boolean().default(false),
	/** why it changes: kept in the audit log */
	reason: z.string().trim().max(500, 'Keep the reason under 500 characters.').default('')
});
export type ChangeCouponForm = z.infer<typeof changeCouponSchema>;
