// Authoring form schemas: lesson drafts, lesson settings, new lessons and assignments (superforms + zod, both sides).
import { z } from 'zod';

/** Long lessons are fine; a body this size is a paste gone wrong, and it would slow every preview. */
export const MAX_BODY_LENGTH = 100_000;

const slug = z
	.string()
	.trim()
	.toLowerCase()
	.min(1, 'Give it a slug (it becomes part of the address).')
	.max(80, 'Use at most 80 characters.')
	.regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'Use lower-case letters, digits and single hyphens, e.g. reading-the-sky.');

const title = z.string().trim().min(1, 'Give it a title.').max(120, 'Use at most 120 characters.');
const summary = z.string().trim().max(400, 'Use at most 400 characters.');
/** superforms reads the typed text as a number; an empty field arrives as 0 and gets the "at least" message */
const minutes = z.number({ error: 'Minutes must be a number.' }).int('Use whole minutes.').min(1, 'At least 1 minute.').max(240, 'At most 240 minutes.');
/** an unticked box sends nothing: missing means off (superforms reads "on" as true) */
const checkbox = z.boolean().default(false);

export const draftSchema = z.object({
	title,
	summary,
	body: z.string().max(MAX_BODY_LENGTH, `The text is over ${MAX_BODY_LENGTH.toLocaleString('en')} characters: split the lesson in two.`),
	note: z.string().trim().max(200, 'Keep the note under 200 characters.').default('')
});
export type DraftInput = z.infer<typeof draftSchema>;
/** The draft form's message: the text, whether it worked, and what stopped a publish. */
export type DraftNotice = { ok: boolean; text: string; problems?: string[] };

export const settingsSchema = z.object({ minutes, freePreview: checkbox });
export type SettingsInput = z.infer<typeof settingsSchema>;

export const newLessonSchema = z.object({
	/** a PostgreSQL integer key: anything outside it names no module */
	moduleId: z.number({ error: 'Choose a module.' }).int('Choose a module.').positive('Choose a module.').max(2_147_483_647, 'Choose a module.'),
	title,
	slug,
	summary,
	minutes: minutes.default(10),
	freePreview: checkbox
});
export type NewLessonInput = z.infer<typeof newLessonSchema>;

export const assignmentFieldsSchema = z.object({
	title,
	brief: z.string().trim().min(1, 'Write a brief: what to shoot and why.').max(4000, 'Use at most 4000 characters.'),
	spec: z.string().max(50_000, 'The spec is too long.')
});
export type AssignmentFieldsInput = z.infer<typeof assignmentFieldsSchema>;
export const newAssignmentSchema = assignmentFieldsSchema.extend({ slug });
export type NewAssignmentInput = z.infer<typeof newAssignmentSchema>;

/** An Assignment form's message: the text, whether it saved, and the spec's problems by path when it did not. */
export type AssignmentNotice = { ok: boolean; text: string; specErrors?: { path: string; message: string }[] };
