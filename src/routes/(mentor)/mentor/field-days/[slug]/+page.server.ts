// Roll call on a phone: each participant with a seat, whether they acknowledged the safety briefing, and who came.
import { error, fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guards';
import { markAttendance, readRollCall } from '$lib/server/field-days/roll-call';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'mentor');
	const found = await readRollCall(user, event.params.slug);
	if (!found.ok) error(found.status, { message: found.message });
	return { day: found.day, participants: found.participants };
};

export const actions = {
	attend: async (event) => {
		const user = requireRole(event, 'mentor');
		const data = await event.request.formData();
		const bookingId = Number(data.get('booking'));
		if (!Number.isInteger(bookingId) || bookingId <= 0) return fail(400, { message: 'Choose a participant from the list.' });
		const done = await markAttendance(user, event.params.slug, bookingId, data.get('came') === 'yes');
		if (!done.ok) return fail(done.status, { message: done.message });
		return { saved: bookingId };
	}
} satisfies Actions;
