// The cohort forms (authors and admins): making a cohort, adding or removing a member by e-mail, setting a due date.
import { z } from 'zod';

export const cohortSchema = z.object({
	title: z.string().trim().min(3, 'Give the cohort a name of at least 3 characters.').max(120, 'Keep the name under 120 characters.'),
	slug: z
		.string()
		.trim()
		.toLowerCase()
		.regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lower-case letters, digits and single hyphens, e.g. autumn-mornings-2027.')
		.max(80, 'Keep the address part under 80 characters.'),
	courseSlug: z.string().trim().min(1, 'Choose the course.'),
	/** empty: no mentor yet */
	mentorEmail: z.string().trim().toLowerCase().max(320).default(''),
	startsOn: z
		.string()
		.trim()
		.regex(/^\d{4}-\d{2}-\d{2}$/, 'Pick the start date.')
		.refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), 'Pick a real date.')
});
export type CohortForm = z.infer<typeof cohortSchema>;

export const memberSchema = z.object({
	email: z.string().trim().toLowerCase().min(1, 'Give the learner’s e-mail address.').max(320, 'That address is too long.').email('Give an e-mail address like name@example.com.')
});
export type MemberForm = z.infer<typeof memberSchema>;

/** Due dates are typed in UTC: a cohort has no time zone of its own, and the reminder e-mails say UTC too. */
export const dueDateSchema = z.object({
	assignmentId: z.number({ error: 'Choose the Assignment.' }).int('Choose the Assignment.').positive('Choose the Assignment.'),
	dueAt: z
		.string()
		.trim()
		.regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}$/, 'Pick a date and a time (UTC).')
		.refine((s) => !Number.isNaN(Date.parse(`${s}:00Z`)), 'Pick a real date and time.')
});
export type DueDateForm = z.infer<typeof dueDateSchema>;

/** Taking a due date away: only which Assignment. */
export const clearDueSchema = dueDateSchema.pick({ assignmentId: true });
export type ClearDueForm = z.infer<typeof clearDueSchema>;
