// Authors' home: every course → its modules → their lessons (drafts included), with moving up and down.
import { fail } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guards';
import { authorOutline, moveLesson, moveModule, type Direction } from '$lib/server/authoring/outline';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const deleted = event.url.searchParams.get('deleted');
	return { courses: await authorOutline(), notice: deleted ? `Deleted “${deleted.slice(0, 120)}”.` : null };
};

async function readMove(request: Request): Promise<{ id: number; direction: Direction } | null> {
	const form = await request.formData();
	const id = Number(form.get('id'));
	const direction = form.get('direction');
	if (!Number.isInteger(id) || id <= 0 || (direction !== 'up' && direction !== 'down')) return null;
	return { id, direction };
}

export const actions = {
	moveModule: async (event) => {
		requireRole(event, 'author');
		const move = await readMove(event.request);
		if (!move) return fail(400, { message: 'Choose a module and a direction.' });
		if (!(await moveModule(move.id, move.direction))) return fail(400, { message: `That module cannot move further ${move.direction}.` });
		return { moved: { kind: 'module', ...move } };
	},
	moveLesson: async (event) => {
		requireRole(event, 'author');
		const move = await readMove(event.request);
		if (!move) return fail(400, { message: 'Choose a lesson and a direction.' });
		if (!(await moveLesson(move.id, move.direction))) return fail(400, { message: `That lesson cannot move further ${move.direction}.` });
		return { moved: { kind: 'lesson', ...move } };
	}
} satisfies Actions;
