// Guard for the author area: authors only (others are sent to sign-in or get a 403 page).
import { requireRole } from '$lib/server/guards';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = (event) => {
	requireRole(event, 'author');
	return {};
};
