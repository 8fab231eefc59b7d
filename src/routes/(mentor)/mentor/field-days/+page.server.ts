// The field days a mentor is on duty for (admins: every day), each with its roll call.
import { requireRole } from '$lib/server/guards';
import { dutyDays } from '$lib/server/field-days/roll-call';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = requireRole(event, 'mentor');
	return { days: await dutyDays(user) };
};
