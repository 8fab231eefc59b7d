// Confirms an e-mail address from a mailed link (new account or change of address); the click is a POST so link scanners cannot use it up.
import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { confirmAddress, describeLink } from '$lib/server/account-links';
import { startSession } from '$lib/server/auth';
import { safeRedirectPath } from '$lib/server/guards';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ url }) => {
	const token = url.searchParams.get('token') ?? '';
	const link = token ? await describeLink(token, ['verify_email', 'change_email']) : null;
	return { token, link };
};

const confirmSchema = z.object({ token: z.string().min(1).max(200) });

export const actions = {
	default: async ({ request, cookies, locals, url }) => {
		const parsed = confirmSchema.safeParse(Object.fromEntries(await request.formData()));
		if (!parsed.success) return fail(400, { message: 'This link is incomplete. Open it again from the e-mail.' });
		const result = await confirmAddress(parsed.data.token);
		if (!result.ok) return fail(400, { message: result.message });
		// a new account's first link proves the mailbox is theirs: it also signs them in (sign-up does not)
		if (result.purpose === 'verify_email' && !locals.user) {
			await startSession(cookies, result.userId, locals.session?.id);
			// back to the page they were on when they signed up (the link carries it)
			const back = safeRedirectPath(url.searchParams.get('redirectTo'), '');
			if (back) redirect(303, back);
		}
		return { confirmed: { purpose: result.purpose, email: result.email } };
	}
} satisfies Actions;
