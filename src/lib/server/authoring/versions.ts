// Lesson drafts and versions: every save is a version; publishing copies one into the lesson learners read.
import { and, desc, eq } from 'drizzle-orm';
import { db, type Db } from '../db';
import { lessonVersions, lessons, users, type Lesson } from '../db/schema';
import type { DraftInput } from '$lib/forms/authoring';
import { readLessonFileBody } from '../lessons/source';
import { renderLessonMarkdown } from '../lessons/render';
import { forgetRenderedLesson, rememberRenderedLesson } from '../lessons/published';
import { clipProblems } from '../clips/publish-check';

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export type AuthoringResult = { ok: true; message: string } | { ok: false; message: string; problems?: string[] };

type Draft = { title: string; summary: string; body: string };

/** The newest saved version of a lesson, or null when it has none yet. */
export async function newestVersion(lessonId: number, tx: Db | Tx = db) {
	const [row] = await tx
		.select()
		.from(lessonVersions)
		.where(eq(lessonVersions.lessonId, lessonId))
		.orderBy(desc(lessonVersions.createdAt), desc(lessonVersions.id))
		.limit(1);
	return row ?? null;
}

/** What the editor opens: the newest version, else the published text, else the lesson file's Markdown. */
export async function currentDraft(lesson: Lesson): Promise<Draft & { savedAt: Date | null }> {
	const newest = await newestVersion(lesson.id);
	if (newest) return { title: newest.title, summary: newest.summary, body: newest.body, savedAt: newest.createdAt };
	const body = lesson.source === 'db' ? (lesson.body ?? '') : ((lesson.contentPath && (await readLessonFileBody(lesson.contentPath))) ?? '');
	return { title: lesson.title, summary: lesson.summary, body, savedAt: null };
}

/** True when learners would see something other than the draft (or nothing, while unpublished). */
export function differsFromPublished(lesson: Pick<Lesson, 'source' | 'published' | 'title' | 'summary' | 'body'>, draft: Draft): boolean {
	if (!lesson.published) return true;
	if (lesson.source === 'file') return false;
	return lesson.title !== draft.title || lesson.summary !== draft.summary || (lesson.body ?? '') !== draft.body;
}

async function lockLesson(tx: Tx, lessonId: number) {
	const [row] = await tx.select().from(lessons).where(eq(lessons.id, lessonId)).for('update');
	return row ?? null;
}

/**
 * A lesson edited in the browser becomes a database lesson (the seed then leaves it alone). Its text starts as the
 * file's Markdown, kept as the first version, so learners keep reading the same lesson until the author publishes.
 */
export async function ensureDbLesson(tx: Tx, lesson: Lesson, authorId: string | null): Promise<AuthoringResult> {
	if (lesson.source === 'db') return { ok: true, message: 'already in the database' };
	const body = lesson.contentPath ? await readLessonFileBody(lesson.contentPath) : null;
	if (body === null) {
		return { ok: false, message: `The lesson file ${lesson.contentPath ?? '(none)'} could not be read, so the lesson was not changed.` };
	}
	await tx.update(lessons).set({ source: 'db', body }).where(eq(lessons.id, lesson.id));
	await tx.insert(lessonVersions).values({
		lessonId: lesson.id,
		title: lesson.title,
		summary: lesson.summary,
		body,
		authorId,
		note: `Imported from ${lesson.contentPath}`
	});
	lesson.source = 'db';
	lesson.body = body;
	return { ok: true, message: 'moved into the database' };
}

const sameDraft = (a: Draft | null, b: Draft) => a !== null && a.title === b.title && a.summary === b.summary && a.body === b.body;

/** Saves the editor's text as a new version; learners see no change until it is published. */
export async function saveDraft(lessonId: number, authorId: string, input: DraftInput): Promise<AuthoringResult> {
	return db.transaction(async (tx) => {
		const lesson = await lockLesson(tx, lessonId);
		if (!lesson) return { ok: false, message: 'That lesson no longer exists.' };
		const moved = await ensureDbLesson(tx, lesson, authorId);
		if (!moved.ok) return moved;
		if (sameDraft(await newestVersion(lessonId, tx), input)) return { ok: true, message: 'No changes since the last save.' };
		await tx.insert(lessonVersions).values({ lessonId, title: input.title, summary: input.summary, body: input.body, authorId, note: input.note || 'Draft' });
		return { ok: true, message: 'Draft saved. Learners still see the published version.' };
	});
}

/**
 * Saves the text as a version and, when it renders without problems, makes it what learners read.
 * With problems it stays a saved draft, so nothing typed is lost.
 */
export async function publishDraft(lessonId: number, authorId: string, input: DraftInput): Promise<AuthoringResult> {
	const rendered = await renderLessonMarkdown(input.body);
	// a clip the text places must be this lesson's and ready: learners would otherwise meet a notice instead of the video
	const problems = [...rendered.problems, ...(await clipProblems(lessonId, rendered.segments))];
	if (problems.length > 0) {
		const saved = await saveDraft(lessonId, authorId, { ...input, note: input.note || 'Draft (publishing was refused)' });
		if (!saved.ok) return saved;
		return { ok: false, message: 'Saved as a draft but not published: fix the problems listed under the preview first.', problems };
	}
	const publishedAt = new Date();
	let madeLive = false;
	const result = await db.transaction(async (tx): Promise<AuthoringResult> => {
		const lesson = await lockLesson(tx, lessonId);
		if (!lesson) return { ok: false, message: 'That lesson no longer exists.' };
		const moved = await ensureDbLesson(tx, lesson, authorId);
		if (!moved.ok) return moved;
		// the newest version is what the editor opens next time: it must be this text
		const changedDraft = !sameDraft(await newestVersion(lessonId, tx), input);
		if (changedDraft || differsFromPublished(lesson, input)) {
			await tx.insert(lessonVersions).values({ lessonId, title: input.title, summary: input.summary, body: input.body, authorId, note: input.note || 'Published' });
		}
		if (!differsFromPublished(lesson, input)) return { ok: true, message: 'Already published as it stands.' };
		await tx
			.update(lessons)
			.set({ title: input.title, summary: input.summary, body: input.body, published: true, updatedAt: publishedAt })
			.where(eq(lessons.id, lessonId));
		madeLive = true;
		return { ok: true, message: 'Published: learners now see this version.' };
	});
	// rendered once, here: learners read this very render
	if (madeLive) {
		rememberRenderedLesson({ id: lessonId, source: 'db', body: input.body, contentPath: null, updatedAt: publishedAt }, rendered);
	}
	return result;
}

/** Takes the lesson away from learners; its text and history stay. */
export async function unpublishLesson(lessonId: number): Promise<AuthoringResult> {
	const [row] = await db
		.update(lessons)
		.set({ published: false, updatedAt: new Date() })
		.where(and(eq(lessons.id, lessonId), eq(lessons.published, true)))
		.returning({ id: lessons.id });
	forgetRenderedLesson(lessonId);
	return row ? { ok: true, message: 'Unpublished: learners no longer see this lesson.' } : { ok: false, message: 'The lesson is not published.' };
}

/** Every version of a lesson, newest first, marking the one learners read. */
export async function listVersions(lessonId: number) {
	const lesson = await db.query.lessons.findFirst({ where: eq(lessons.id, lessonId) });
	if (!lesson) return null;
	const rows = await db
		.select({
			id: lessonVersions.id,
			title: lessonVersions.title,
			summary: lessonVersions.summary,
			body: lessonVersions.body,
			note: lessonVersions.note,
			createdAt: lessonVersions.createdAt,
			author: users.name
		})
		.from(lessonVersions)
		.leftJoin(users, eq(lessonVersions.authorId, users.id))
		.where(eq(lessonVersions.lessonId, lessonId))
		.orderBy(desc(lessonVersions.createdAt), desc(lessonVersions.id));
	let liveFound = false;
	const versions = rows.map((v) => {
		// the newest version equal to the lesson's text is the live one (older equal ones are earlier saves of it)
		const live = !liveFound && lesson.published && lesson.source === 'db' && !differsFromPublished(lesson, v);
		liveFound ||= live;
		return { ...v, live };
	});
	return { lesson, versions };
}

/** Makes an old version the draft again by saving a copy of it as the newest version; nothing is overwritten. */
export async function restoreVersion(lessonId: number, versionId: number, authorId: string): Promise<AuthoringResult> {
	return db.transaction(async (tx) => {
		const lesson = await lockLesson(tx, lessonId);
		if (!lesson) return { ok: false, message: 'That lesson no longer exists.' };
		const old = await tx.query.lessonVersions.findFirst({ where: and(eq(lessonVersions.id, versionId), eq(lessonVersions.lessonId, lessonId)) });
		if (!old) return { ok: false, message: 'That version is not part of this lesson.' };
		const moved = await ensureDbLesson(tx, lesson, authorId);
		if (!moved.ok) return moved;
		const when = old.createdAt.toISOString().slice(0, 16).replace('T', ' ');
		await tx.insert(lessonVersions).values({ lessonId, title: old.title, summary: old.summary, body: old.body, authorId, note: `Restored the version of ${when} UTC` });
		return { ok: true, message: `Restored the version of ${when} UTC as the draft. Publish it to show it to learners.` };
	});
}
