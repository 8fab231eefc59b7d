// Sign in with e-mail and password; throttled; comes back to ?redirectTo= (same-origin paths only), else lands where the person works.
import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signInSchema } from '$lib/forms/account';
import { signInWithPassword, throttledMessage } from '$lib/server/accounts';
import { startSession } from '$lib/server/auth';
import { safeRedirectPath } from '$lib/server/guards';
import { landingPathFor, landingPathForId } from '$lib/server/landing';
import { signInReason } from '$lib/sign-in-reason';
import type { Actions, PageServerLoad } from './$types';

const notices: Record<string, string> = {
	'password-changed': 'Your password is changed. Sign in with the new one.',
	'signed-out-everywhere': 'You are signed out on every device.',
	'signed-out': 'You are signed out.'
};

/** A same-origin path to return to, or '' when there is none (or it points elsewhere). */
const returnPath = (raw: string | null | undefined) => safeRedirectPath(raw, '');

export const load: PageServerLoad = async ({ locals, url }) => {
	const redirectTo = returnPath(url.searchParams.get('redirectTo'));
	if (locals.user) redirect(303, redirectTo || (await landingPathFor(locals.user)));
	const form = await superValidate({ redirectTo }, zod4(signInSchema), { errors: false });
	return { form, notice: notices[url.searchParams.get('notice') ?? ''] ?? null, reason: signInReason(redirectTo), redirectTo };
};

export const actions = {
	default: async ({ request, cookies, locals, getClientAddress }) => {
		const form = await superValidate(request, zod4(signInSchema));
		const { email, password, redirectTo } = form.data;
		form.data.password = ''; // never echo a password back into the page
		if (!form.valid) return fail(400, { form });
		const result = await signInWithPassword(email, password, getClientAddress());
		if (!result.ok && result.reason === 'throttled') {
			return message(form, throttledMessage(result.retryAfterSeconds), { status: 429 });
		}
		if (!result.ok) return message(form, 'That e-mail address and password do not match an account.', { status: 400 });
		await startSession(cookies, result.userId, locals.session?.id);
		redirect(303, returnPath(redirectTo) || (await landingPathForId(result.userId)));
	}
} satisfies Actions;
