// The admin's enrolment forms: opening a course to a person by hand, and revoking or restoring one (superforms + zod, both sides).
import { z } from 'zod';

export const grantSchema = z.object({
	email: z.string().trim().toLowerCase().max(254, 'That address is too long.').pipe(z.email('Enter the learner’s e-mail address.')),
	course: z.string().trim().min(1, 'Choose a course.').max(100, 'Choose a course.'),
	reason: z.string().trim().max(500, 'Keep the reason under 500 characters.').default('')
});
export type GrantForm = z.infer<typeof grantSchema>;

/** Revoking or restoring one enrolment; the row's button says which (its `status`). */
export const enrolmentStatusSchema = z.object({
	enrolmentId: z.number({ error: 'That change is not valid.' }).int('That change is not valid.').positive('That change is not valid.'),
	status: z.enum(['active', 'revoked'], 'That change is not valid.'),
	reason: z.string().trim().max(500, 'Keep the reason under 500 characters.').default('')
});
export type EnrolmentStatusForm = z.infer<typeof enrolmentStatusSchema>;
