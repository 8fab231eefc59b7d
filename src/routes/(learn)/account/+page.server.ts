// The signed-in person's account: address and its verification, password, sessions.
import { fail, redirect } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { changeEmailSchema, changePasswordSchema } from '$lib/forms/account';
import { changePassword, confirmPassword } from '$lib/server/accounts';
import { requestEmailChange, resendVerificationMail } from '$lib/server/account-links';
import { countSessions, endAllSessions, endSession, startSession } from '$lib/server/auth';
import { requireUser } from '$lib/server/guards';
import { sendLetter } from '$lib/server/mail';
import { passwordChangedNotice } from '$lib/server/mail-letters';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const [emailForm, passwordForm, sessions] = await Promise.all([
		superValidate(zod4(changeEmailSchema), { id: 'change-email' }),
		superValidate(zod4(changePasswordSchema), { id: 'change-password' }),
		countSessions(user.id)
	]);
	return {
		account: { name: user.name, email: user.email, emailVerified: user.emailVerified, roles: user.roles },
		sessions,
		emailForm,
		passwordForm
	};
};

export const actions = {
	changeEmail: async (event) => {
		const user = requireUser(event);
		const form = await superValidate(event.request, zod4(changeEmailSchema), { id: 'change-email' });
		const { password, newEmail } = form.data;
		form.data.password = '';
		if (!form.valid) return fail(400, { form });
		const check = await confirmPassword(user.id, password, event.getClientAddress());
		if (!check.ok) return setError(form, 'password', check.message);
		const result = await requestEmailChange(user, newEmail, event.url.origin);
		if (!result.ok) return setError(form, result.field, result.message);
		return message(form, `We sent a link to ${newEmail}. Your address changes when you open it; until then it stays ${user.email}.`);
	},

	changePassword: async (event) => {
		const user = requireUser(event);
		const form = await superValidate(event.request, zod4(changePasswordSchema), { id: 'change-password' });
		const { currentPassword, newPassword } = form.data;
		form.data.currentPassword = '';
		form.data.newPassword = '';
		if (!form.valid) return fail(400, { form });
		const result = await changePassword(user.id, currentPassword, newPassword, event.getClientAddress());
		if (!result.ok) return setError(form, result.field, result.message);
		// every session ended with the change: this browser gets a fresh one
		await startSession(event.cookies, user.id);
		await sendLetter(passwordChangedNotice(user.email, user.name));
		return message(form, 'Your password is changed. Other devices were signed out.');
	},

	resendVerification: async (event) => {
		const user = requireUser(event);
		if (user.emailVerified) return fail(400, { resend: { ok: false, text: 'Your address is verified already.' } });
		const sent = await resendVerificationMail(user, event.url.origin);
		if (!sent.ok) return fail(429, { resend: { ok: false, text: sent.reason } });
		return { resend: { ok: true, text: `We sent a new link to ${user.email}.` } };
	},

	signOutEverywhere: async (event) => {
		const user = requireUser(event);
		await endAllSessions(user.id);
		await endSession(event.cookies, null);
		redirect(303, '/signin?notice=signed-out-everywhere');
	}
} satisfies Actions;
