// Create an account (learner), sign in, send the verification link, and go back where the visitor was (?redirectTo=).
import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signUpSchema } from '$lib/forms/account';
import { signUp } from '$lib/server/accounts';
import { sendVerificationMail } from '$lib/server/account-links';
import { startSession } from '$lib/server/auth';
import { safeRedirectPath } from '$lib/server/guards';
import { signInReason } from '$lib/sign-in-reason';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const redirectTo = safeRedirectPath(url.searchParams.get('redirectTo'), '');
	if (locals.user) redirect(303, redirectTo || '/account');
	const form = await superValidate({ redirectTo }, zod4(signUpSchema), { errors: false });
	return { form, reason: signInReason(redirectTo)?.replace(/^Sign in/, 'Create an account') ?? null, redirectTo };
};

export const actions = {
	default: async ({ request, cookies, locals, url }) => {
		const form = await superValidate(request, zod4(signUpSchema));
		const { name, email, password, redirectTo } = form.data;
		form.data.password = '';
		if (!form.valid) return fail(400, { form });
		const created = await signUp({ name, email, password });
		if (!created.ok) return setError(form, created.field, created.message);
		await startSession(cookies, created.userId, locals.session?.id);
		const sent = await sendVerificationMail({ id: created.userId, email, name }, url.origin);
		// back where the visitor was (the header's dot says the address is not verified yet), else the welcome page
		const back = safeRedirectPath(redirectTo, '');
		redirect(303, back || `/account?notice=${sent.ok ? 'welcome' : 'welcome-mail-failed'}`);
	}
} satisfies Actions;
