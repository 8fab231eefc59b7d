// Field days for authors and admins: every day scheduled, newest first, with links to change one or schedule another.
import { requireRole } from '$lib/server/guards';
import { authorFieldDays } from '$lib/server/field-days/options';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	return { days: await authorFieldDays(), notice: event.url.searchParams.get('notice') };
};
