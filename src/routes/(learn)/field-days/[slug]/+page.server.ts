// One field day: the safety briefing and refund rule before booking, the learner's seat, waiting place or offer, and cancelling.
import { error, fail, redirect } from '@sveltejs/kit';
import { requireUser } from '$lib/server/guards';
import { fieldDayPage } from '$lib/server/field-days/read';
import { bookSeat, cancelBooking } from '$lib/server/field-days/booking';
import { confirmFieldDayPayment } from '$lib/server/field-days/payment';
import { acknowledgeOnDay } from '$lib/server/field-days/roll-call';
import { bookSchema } from '$lib/forms/field-days';
import { formatPrice } from '$lib/format';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	// back from the payment page: settle now, so the seat never waits on the webhook
	const paid = event.url.searchParams.get('paid');
	const confirmed = paid ? await confirmFieldDayPayment(user, paid, event.url.origin) : null;
	const day = await fieldDayPage(event.params.slug, user);
	if (!day) error(404, { message: 'There is no such field day.' });
	const checkout = event.url.searchParams.get('checkout');
	const notice =
		confirmed === 'booked'
			? 'Paid: your seat is booked. The invitation is on its way by e-mail.'
			: confirmed === 'open'
				? 'The payment has not gone through yet. Your seat is held until the time shown.'
				: checkout === 'cancelled'
					? 'Checkout cancelled: nothing was charged. Your seat is held for a short while if you want to try again.'
					: null;
	return { day, notice };
};

/** One shape for the page: a refusal or a confirmation. */
const note = (message: string | null, done: string | null = null) => ({ message, done });

async function fieldDayId(slug: string, viewer: Parameters<typeof fieldDayPage>[1]) {
	const day = await fieldDayPage(slug, viewer);
	return day?.id ?? null;
}

export const actions = {
	book: async (event) => {
		const user = requireUser(event);
		const parsed = bookSchema.safeParse({ acknowledged: (await event.request.formData()).get('acknowledged') === 'on' });
		const id = await fieldDayId(event.params.slug, user);
		if (id === null) return fail(404, { book: note('There is no such field day.') });
		const outcome = await bookSeat(user, id, parsed.success && parsed.data.acknowledged, event.url.origin);
		if (outcome.kind === 'refused') return fail(outcome.status, { book: note(outcome.message) });
		// the provider's payment page, on another origin: a plain POST, so the browser follows this 303
		if (outcome.kind === 'pay') redirect(303, outcome.url);
		return { book: note(null, outcome.kind === 'booked' ? 'Your seat is booked. The invitation is on its way by e-mail.' : `The day is full: you are number ${outcome.position} on the waiting list. We e-mail you if a seat comes free.`) };
	},
	cancel: async (event) => {
		const user = requireUser(event);
		const id = await fieldDayId(event.params.slug, user);
		if (id === null) return fail(404, { cancel: note('There is no such field day.') });
		const outcome = await cancelBooking(user, id, event.url.origin);
		if (!outcome.ok) return fail(outcome.status, { cancel: note(outcome.message) });
		const refunded = outcome.refundedCents > 0 ? ` ${formatPrice(outcome.refundedCents, outcome.currency)} is refunded.` : '';
		return { cancel: note(null, `Cancelled.${refunded}`) };
	},
	acknowledge: async (event) => {
		const user = requireUser(event);
		const id = await fieldDayId(event.params.slug, user);
		if (id === null) return fail(404, { acknowledge: note('There is no such field day.') });
		const done = await acknowledgeOnDay(user, id);
		if (!done.ok) return fail(done.status, { acknowledge: note(done.message) });
		return { acknowledge: note(null, 'Thank you: the mentor on duty sees that you heard the briefing.') };
	}
} satisfies Actions;
