// Account form schemas, shared by the server (authoritative) and the browser (early hints).
import { z } from 'zod';

const email = z
	.string()
	.trim()
	.toLowerCase()
	.min(1, 'Enter your e-mail address.')
	.max(254, 'That address is too long.')
	.pipe(z.email('That does not look like an e-mail address.'));

/** Long passphrases are welcome; argon2 input is bounded so a huge paste cannot tie up the server. */
const newPassword = z
	.string()
	.min(10, 'Use at least 10 characters.')
	.max(200, 'Use at most 200 characters.');

const anyPassword = z.string().min(1, 'Enter your password.').max(200, 'Use at most 200 characters.');

export const signInSchema = z.object({
	email,
	password: anyPassword,
	redirectTo: z.string().max(2000).default('')
});

export const signUpSchema = z
	.object({
		name: z.string().trim().min(1, 'Tell us your name.').max(80, 'Use at most 80 characters.'),
		email,
		password: newPassword,
		redirectTo: z.string().max(2000).default('')
	})
	.refine((v) => v.email === '' || v.password.trim().toLowerCase() !== v.email, {
		message: 'Your password cannot be your e-mail address.',
		path: ['password']
	});

export const resetRequestSchema = z.object({ email });

export const resetConfirmSchema = z.object({
	token: z.string().min(1).max(200),
	password: newPassword
});

export const changeEmailSchema = z.object({
	newEmail: email,
	password: anyPassword
});

export const changePasswordSchema = z.object({
	currentPassword: anyPassword,
	newPassword
});
