// Password reset: ask for a link by e-mail, then (with ?token=) choose a new password; each link works once.
import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { resetConfirmSchema, resetRequestSchema } from '$lib/forms/account';
import { describeLink, requestPasswordReset, resetPassword } from '$lib/server/account-links';
import { sendInBackground } from '$lib/server/mail';
import type { Actions, PageServerLoad } from './$types';

const spentLink = 'This link has expired or has been used already. Ask for a new one below.';

export const load: PageServerLoad = async ({ url }) => {
	const token = url.searchParams.get('token') ?? '';
	const [requestForm, confirmForm, link] = await Promise.all([
		superValidate(zod4(resetRequestSchema), { id: 'reset-request' }),
		superValidate({ token }, zod4(resetConfirmSchema), { id: 'reset-confirm', errors: false }),
		token ? describeLink(token, ['reset_password']) : null
	]);
	return { requestForm, confirmForm, hasToken: token !== '', linkUsable: link !== null };
};

export const actions = {
	request: async ({ request, url }) => {
		const form = await superValidate(request, zod4(resetRequestSchema), { id: 'reset-request' });
		if (!form.valid) return fail(400, { form });
		// not awaited: the answer and its timing are the same for every address (tracked, so tests can wait for it)
		sendInBackground('password reset', () => requestPasswordReset(form.data.email, url.origin));
		return message(
			form,
			`If ${form.data.email} belongs to an account, a link to choose a new password is on its way. It works for one hour.`
		);
	},
	confirm: async ({ request }) => {
		const form = await superValidate(request, zod4(resetConfirmSchema), { id: 'reset-confirm' });
		const { token, password } = form.data;
		form.data.password = '';
		if (!form.valid) return fail(400, { form });
		const done = await resetPassword(token, password);
		if (!done) return message(form, spentLink, { status: 400 });
		redirect(303, '/signin?notice=password-changed');
	}
} satisfies Actions;
