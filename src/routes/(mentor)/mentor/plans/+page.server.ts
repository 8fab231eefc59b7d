// Shoot Plans waiting for a mentor, oldest first (a mentor's own plans are left to another mentor).
import { requireRole } from '$lib/server/guards';
import { listWaitingPlans } from '$lib/server/shoot-plans';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const mentor = requireRole(event, 'mentor');
	const plans = await listWaitingPlans(mentor.id);
	return { plans: plans.map((p) => ({ ...p, createdAt: p.createdAt.toISOString() })) };
};
