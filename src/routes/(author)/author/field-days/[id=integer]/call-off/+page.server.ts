// Calling off a field day: a confirmation page that says who is told and what is refunded, then the call-off itself.
import { error, fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { callOffSchema } from '$lib/forms/field-days';
import { callOffFieldDay, callOffSummary } from '$lib/server/field-days/call-off';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const id = Number(event.params.id);
	const summary = await callOffSummary(id);
	if (!summary) error(404, { message: 'There is no such field day.' });
	const form = await superValidate({ reason: summary.calledOff?.reason ?? '', confirmed: false }, zod4(callOffSchema), { errors: false });
	return { id, summary, form };
};

export const actions = {
	default: async (event) => {
		const user = requireRole(event, 'author');
		const form = await superValidate(event.request, zod4(callOffSchema));
		if (!form.valid) return fail(400, { form });
		const outcome = await callOffFieldDay(user, Number(event.params.id), form.data.reason, event.url.origin);
		if (!outcome.ok) return setError(form, '', outcome.message, { status: outcome.status });
		if (outcome.refundsLeft > 0) {
			const n = outcome.refundsLeft;
			return setError(form, '', `The day is called off and ${outcome.told} people were told, but the payment service could not make ${n} refund${n === 1 ? '' : 's'} just now; ${n === 1 ? 'that seat is' : 'those seats are'} kept until it does. Press the button again in a minute to finish.`, { status: 502 });
		}
		redirect(303, `/author/field-days?notice=called-off&told=${outcome.told}&refunded=${outcome.refunded}`);
	}
} satisfies Actions;
