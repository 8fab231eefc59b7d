// Only what the header and pages need about the signed-in person goes to the browser.
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = ({ locals }) => {
	const user = locals.user;
	return {
		user: user ? { name: user.name, emailVerified: user.emailVerified, roles: user.roles } : null
	};
};
