// Create an account (learner), sign in, and send the verification link.
import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signUpSchema } from '$lib/forms/account';
import { signUp } from '$lib/server/accounts';
import { sendVerificationMail } from '$lib/server/account-links';
import { startSession } from '$lib/server/auth';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals }) => {
	if (locals.user) redirect(303, '/account');
	return { form: await superValidate(zod4(signUpSchema)) };
};

export const actions = {
	default: async ({ request, cookies, locals, url }) => {
		const form = await superValidate(request, zod4(signUpSchema));
		const { name, email, password } = form.data;
		form.data.password = '';
		if (!form.valid) return fail(400, { form });
		const created = await signUp({ name, email, password });
		if (!created.ok) return setError(form, created.field, created.message);
		await startSession(cookies, created.userId, locals.session?.id);
		const sent = await sendVerificationMail({ id: created.userId, email, name }, url.origin);
		redirect(303, `/account?notice=${sent.ok ? 'welcome' : 'welcome-mail-failed'}`);
	}
} satisfies Actions;
