// Authors' overview: every lesson, published or draft, and where its text lives.
import { requireRole } from '$lib/server/guards';
import { listLessonsForAuthors } from '$lib/server/staff-overview';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	return { lessons: await listLessonsForAuthors() };
};
