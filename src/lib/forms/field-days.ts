// The field-day forms: scheduling one (authors and admins) and booking a seat (superforms + zod, both sides).
import { z } from 'zod';

const localDateTime = z
	.string()
	.trim()
	.regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/, 'Pick a date and a time.');

const optionalCoordinate = (min: number, max: number, what: string) =>
	z
		.string()
		.trim()
		.refine((s) => s === '' || (/^-?\d{1,3}(\.\d{1,7})?$/.test(s) && Number(s) >= min && Number(s) <= max), `Give the ${what} in decimal degrees (${min} to ${max}), or leave it empty.`)
		.default('');

export const fieldDaySchema = z
	.object({
		title: z.string().trim().min(3, 'Give the field day a title of at least 3 characters.').max(120, 'Keep the title under 120 characters.'),
		slug: z
			.string()
			.trim()
			.toLowerCase()
			.regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lower-case letters, digits and single hyphens, e.g. trail-running-morning.')
			.max(80, 'Keep the address part under 80 characters.'),
		summary: z.string().trim().max(1000, 'Keep the summary under 1000 characters.').default(''),
		courseSlug: z.string().trim().min(1, 'Choose the course it belongs to.'),
		assignmentSlug: z.string().trim().max(120).default(''),
		startsAt: localDateTime,
		endsAt: localDateTime,
		timeZone: z
			.string()
			.trim()
			.refine((tz) => {
				try {
					new Intl.DateTimeFormat('en', { timeZone: tz });
					return tz.length > 0;
				} catch {
					return false;
				}
			}, 'Give a time zone by its IANA name, e.g. America/New_York.'),
		meetingPoint: z.string().trim().min(3, 'Say where people meet.').max(500, 'Keep the meeting point under 500 characters.'),
		latitude: optionalCoordinate(-90, 90, 'latitude'),
		longitude: optionalCoordinate(-180, 180, 'longitude'),
		seats: z.number({ error: 'Give the number of seats as a whole number.' }).int('Give the number of seats as a whole number.').min(1, 'At least one seat.').max(500, 'At most 500 seats.'),
		price: z
			.string()
			.trim()
			.regex(/^\d{1,5}(\.\d{1,2})?$/, 'Give the price like 45 or 45.00 (0 for free).')
			.default('0'),
		includedWithEnrolment: z.boolean().default(false),
		refundHours: z.number({ error: 'Give the refund limit in whole hours.' }).int('Give the refund limit in whole hours.').min(0, 'Use 0 to refund up to the start.').max(24 * 60, 'At most 60 days.').default(48),
		kitList: z.string().trim().max(2000, 'Keep the kit list under 2000 characters.').default(''),
		safetyBriefing: z.string().trim().min(40, 'The safety briefing is required: at least a few sentences (40 characters).').max(5000, 'Keep the safety briefing under 5000 characters.'),
		mentorEmails: z.string().trim().max(2000).default('')
	})
	.refine((v) => v.endsAt > v.startsAt, { message: 'The end must be after the start.', path: ['endsAt'] });
export type FieldDayForm = z.infer<typeof fieldDaySchema>;

export const bookSchema = z.object({
	/** an unticked box sends nothing */
	acknowledged: z.boolean().default(false)
});

export const callOffSchema = z.object({
	reason: z.string().trim().min(10, 'Say why in a sentence: every participant reads it (at least 10 characters).').max(500, 'Keep the reason under 500 characters.'),
	/** an unticked box sends nothing */
	confirmed: z.boolean().default(false).refine((v) => v, 'Tick the box to confirm: this cannot be undone.')
});
export type CallOffForm = z.infer<typeof callOffSchema>;
