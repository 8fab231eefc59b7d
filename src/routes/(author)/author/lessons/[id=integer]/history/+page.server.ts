// A lesson's version history, newest first, with restore (which saves a copy as the draft; nothing is overwritten).
import { recordAudit } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { error, fail, redirect } from '@sveltejs/kit';
import { requireRole } from '$lib/server/guards';
import { listVersions, restoreVersion } from '$lib/server/authoring/versions';
import type { Actions, PageServerLoad } from './$types';


export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const found = await listVersions(Number(event.params.id));
	if (!found) error(404, { message: 'There is no such lesson.' });
	return {
		lesson: { id: found.lesson.id, title: found.lesson.title, source: found.lesson.source, contentPath: found.lesson.contentPath },
		versions: found.versions.map((v) => ({ ...v, createdAt: v.createdAt.toISOString() }))
	};
};

export const actions = {
	restore: async (event) => {
		const user = requireRole(event, 'author');
		const versionId = Number((await event.request.formData()).get('versionId'));
		if (!Number.isInteger(versionId) || versionId <= 0) return fail(400, { message: 'Choose a version to restore.' });
		const restored = await restoreVersion(Number(event.params.id), versionId, user.id);
		if (!restored.ok) return fail(400, { message: restored.message });
		await recordAudit(db, user, { action: 'lesson.restore', subject: `lesson ${event.params.id}`, detail: `version ${versionId} restored as the draft`, href: `/author/lessons/${event.params.id}/history` });
		redirect(303, `/author/lessons/${event.params.id}?notice=restored`);
	}
} satisfies Actions;
