// Field days: the upcoming days with seats left, the learner's own bookings and their private calendar address.
import { requireUser } from '$lib/server/guards';
import { listFieldDays, myFieldDays } from '$lib/server/field-days/read';
import { feedToken, resetFeedToken } from '$lib/server/field-days/calendar';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireUser(event);
	const [days, mine, token] = await Promise.all([listFieldDays(), myFieldDays(user.id), feedToken(user.id)]);
	return { days, mine, feedUrl: `${event.url.origin}/api/v1/calendar/${token}` };
};

export const actions = {
	resetFeed: async (event) => {
		const user = requireUser(event);
		await resetFeedToken(user.id);
		return { reset: true };
	}
} satisfies Actions;
