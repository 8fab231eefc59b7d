// The lesson editor: Markdown with a live preview, drafts, publish/unpublish, settings, and deleting an unused draft.
import { recordAudit } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { error, fail, redirect } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { requireRole } from '$lib/server/guards';
import { deleteDraftLesson, openLessonForEditing, saveLessonSettings } from '$lib/server/authoring/lessons';
import { publishDraft, saveDraft, unpublishLesson } from '$lib/server/authoring/versions';
import { renderLessonMarkdown } from '$lib/server/lessons/render';
import { checkSpecText } from '$lib/server/authoring/assignments';
import { lessonClipCards } from '$lib/server/clips/view';
import { draftSchema, settingsSchema, type DraftInput, type DraftNotice } from '$lib/forms/authoring';
import type { Actions, PageServerLoad } from './$types';

const notices: Record<string, string> = {
	created: 'Lesson created. Write it below; it stays unpublished until you publish it.',
	restored: 'Version restored as the draft. Publish it to show it to learners.'
};


export const load: PageServerLoad = async (event) => {
	requireRole(event, 'author');
	const found = await openLessonForEditing(Number(event.params.id));
	if (!found) error(404, { message: 'There is no such lesson.' });
	const { lesson, module, course, draft, assignments, unpublishedChanges } = found;
	const draftForm = await superValidate<DraftInput, DraftNotice>({ title: draft.title, summary: draft.summary, body: draft.body, note: '' }, zod4(draftSchema), {
		id: 'lesson-draft',
		errors: false
	});
	const settingsForm = await superValidate({ minutes: lesson.minutes, freePreview: lesson.freePreview }, zod4(settingsSchema), { id: 'lesson-settings', errors: false });
	return {
		lesson: {
			id: lesson.id,
			slug: lesson.slug,
			published: lesson.published,
			source: lesson.source,
			contentPath: lesson.contentPath,
			minutes: lesson.minutes,
			freePreview: lesson.freePreview
		},
		module: { title: module.title },
		course: { slug: course.slug, title: course.title },
		draft: { title: draft.title, summary: draft.summary, body: draft.body, savedAt: draft.savedAt?.toISOString() ?? null },
		unpublishedChanges,
		preview: await renderLessonMarkdown(draft.body),
		// what <AssignmentCard> reads in the preview (no uploads from here)
		assignments: assignments.map((a) => {
			const described = checkSpecText(JSON.stringify(a.spec));
			return { id: a.id, slug: a.slug, title: a.title, brief: a.brief, frames: described.frames, criteria: described.criteria };
		}),
		// what <Clip> reads in the preview, every clip with its state (the Clips panel lists them too)
		clips: await lessonClipCards(lesson.id),
		// tells the Quiz widget not to store answers given in the preview
		lessonPreview: true,
		draftForm,
		settingsForm,
		notice: notices[event.url.searchParams.get('notice') ?? ''] ?? null
	};
};

const readDraft = (request: Request) => superValidate<DraftInput, DraftNotice>(request, zod4(draftSchema), { id: 'lesson-draft' });
const notSaved: DraftNotice = { ok: false, text: 'Nothing was saved: check the fields marked.' };

export const actions = {
	save: async (event) => {
		const user = requireRole(event, 'author');
		const form = await readDraft(event.request);
		if (!form.valid) return message(form, notSaved, { status: 400 });
		const saved = await saveDraft(Number(event.params.id), user.id, form.data);
		if (!saved.ok) return message(form, { ok: false, text: saved.message }, { status: 400 });
		form.data.note = '';
		return message(form, { ok: true, text: saved.message });
	},
	publish: async (event) => {
		const user = requireRole(event, 'author');
		const form = await readDraft(event.request);
		if (!form.valid) return message(form, notSaved, { status: 400 });
		const published = await publishDraft(Number(event.params.id), user.id, form.data);
		if (!published.ok) return message(form, { ok: false, text: published.message, problems: published.problems ?? [] }, { status: 400 });
		await recordAudit(db, user, { action: 'lesson.publish', subject: form.data.title, detail: `lesson ${event.params.id}`, reason: form.data.note, href: `/author/lessons/${event.params.id}` });
		form.data.note = '';
		return message(form, { ok: true, text: published.message });
	},
	unpublish: async (event) => {
		requireRole(event, 'author');
		const done = await unpublishLesson(Number(event.params.id));
		if (!done.ok) return fail(400, { state: { ok: false, message: done.message } });
		return { state: { ok: true, message: done.message } };
	},
	settings: async (event) => {
		const user = requireRole(event, 'author');
		const form = await superValidate(event.request, zod4(settingsSchema), { id: 'lesson-settings' });
		if (!form.valid) return setError(form, 'Settings not saved.');
		const saved = await saveLessonSettings(Number(event.params.id), user.id, form.data);
		if (!saved.ok) return setError(form, saved.message);
		return message(form, saved.message);
	},
	delete: async (event) => {
		requireRole(event, 'author');
		const found = await openLessonForEditing(Number(event.params.id));
		const done = await deleteDraftLesson(Number(event.params.id));
		if (!done.ok) return fail(400, { state: { ok: false, message: done.message } });
		redirect(303, `/author?deleted=${encodeURIComponent(found?.draft.title ?? 'the lesson')}`);
	}
} satisfies Actions;
