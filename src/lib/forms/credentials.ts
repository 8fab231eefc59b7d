// Certificate forms: claiming one, checking a pasted credential, an admin's revocation, an author's rules (superforms + zod, both sides).
import { z } from 'zod';

/** Longer than any certificate we issue (about 3 KB) by far; the server refuses a longer paste with this message. */
export const MAX_PASTE_CHARS = 16_384;

export const claimSchema = z.object({
	course: z.string().trim().min(1, 'Choose a course.').max(100, 'Choose a course.')
});
export type ClaimForm = z.infer<typeof claimSchema>;

export const verifySchema = z.object({
	credential: z
		.string()
		.trim()
		.min(1, 'Paste a credential first: the .jwt text or the .json file’s contents.')
		.max(MAX_PASTE_CHARS, `That is far longer than any certificate (${MAX_PASTE_CHARS.toLocaleString('en')} characters at most): paste only the credential.`)
});
export type VerifyForm = z.infer<typeof verifySchema>;

export const revokeSchema = z.object({
	credentialId: z.uuid('That certificate is not valid.'),
	reason: z.string().trim().min(1, 'Say why, for the audit log and the verification page.').max(500, 'Keep the reason under 500 characters.')
});
export type RevokeForm = z.infer<typeof revokeSchema>;

/** Which Assignments count towards a course's certificate, and how many of them must be passed (empty: all). */
export const rulesSchema = z.object({
	course: z.string().trim().min(1, 'Choose a course.').max(100, 'Choose a course.'),
	counted: z.array(z.number({ error: 'That Assignment is not valid.' }).int().positive()).max(500).default([]),
	minimum: z
		.number({ error: 'Give a whole number, or leave it empty for all.' })
		.int('Give a whole number, or leave it empty for all.')
		.min(0, 'The minimum cannot be negative.')
		.max(500, 'That is more Assignments than a course has.')
		.optional()
});
export type RulesForm = z.infer<typeof rulesSchema>;
