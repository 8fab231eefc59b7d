// Field days for authors and admins: every day scheduled, newest first, with links to change one or schedule another.
import { requireRole } from '$lib/server/guards';
import { authorFieldDays } from '$lib/server/field-days/options';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const count = (name: string) => Math.max(0, Math.trunc(Number(event.url.searchParams.get(name)) || 0));
	return { days: await authorFieldDays(), notice: event.url.searchParams.get('notice'), told: count('told'), refunded: count('refunded') };
};
