// Create an account (learner): the same answer for a new and an existing address; the e-mail tells which (?redirectTo= travels in it).
import { fail, redirect } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signUpSchema } from '$lib/forms/account';
import { signUp } from '$lib/server/accounts';
import { mailAfterSignUp } from '$lib/server/account-links';
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
	default: async ({ request, url }) => {
		const form = await superValidate(request, zod4(signUpSchema));
		const { name, email, password, redirectTo } = form.data;
		form.data.password = '';
		if (!form.valid) return fail(400, { form });
		// the password is hashed either way (signUp hashes before it tries the insert), so the time taken tells nothing
		const made = await signUp({ name, email, password });
		const back = safeRedirectPath(redirectTo, '');
		mailAfterSignUp(made.ok ? { created: true, user: { id: made.userId, email, name } } : { created: false, email }, url.origin, back);
		// nobody is signed in here: the link in the e-mail proves the inbox is theirs and signs them in
		redirect(303, '/signup/sent');
	}
} satisfies Actions;
