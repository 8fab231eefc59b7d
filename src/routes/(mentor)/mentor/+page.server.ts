// Review queue landing page for mentors: waiting attempts (none until uploads exist) and the assignments.
import { requireRole } from '$lib/server/guards';
import { listAssignmentsForReview } from '$lib/server/staff-overview';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'mentor');
	return { assignments: await listAssignmentsForReview() };
};
