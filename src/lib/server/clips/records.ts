// The lesson_clips rows: adding a clip, its upload, the transcoding's state and progress, and the clips of a lesson.
import { and, asc, eq, inArray, lt } from 'drizzle-orm';
import { randomUUID } from 'node:crypto';
import { db } from '../db/index';
import { lessonClips, type LessonClip } from '../db/schema';
import type { ClipRendition } from '../db/json-types';

export type { LessonClip };

export async function findClip(id: string): Promise<LessonClip | null> {
	const [row] = await db.select().from(lessonClips).where(eq(lessonClips.id, id)).limit(1);
	return row ?? null;
}

export async function findClipByUpload(uploadId: string): Promise<LessonClip | null> {
	const [row] = await db.select().from(lessonClips).where(eq(lessonClips.uploadId, uploadId)).limit(1);
	return row ?? null;
}

export async function clipsOfLesson(lessonId: number): Promise<LessonClip[]> {
	return db.select().from(lessonClips).where(eq(lessonClips.lessonId, lessonId)).orderBy(asc(lessonClips.createdAt));
}

/** A new clip waiting for its file; null when the lesson already has a clip of that name. */
export async function createClip(row: { lessonId: number; name: string; title: string; captions: string; createdBy: string | null }): Promise<string | null> {
	const id = randomUUID();
	const inserted = await db.insert(lessonClips).values({ id, ...row }).onConflictDoNothing().returning({ id: lessonClips.id });
	return inserted[0]?.id ?? null;
}

/** Ties a started upload to a clip still waiting for its file; false when the clip is past that. */
export async function attachUpload(clipId: string, uploadId: string, size: number): Promise<{ ok: boolean; replaced: string | null }> {
	return db.transaction(async (tx) => {
		const [row] = await tx.select().from(lessonClips).where(eq(lessonClips.id, clipId)).for('update');
		if (!row || row.status !== 'uploading') return { ok: false, replaced: null };
		await tx.update(lessonClips).set({ uploadId, uploadSize: size, updatedAt: new Date() }).where(eq(lessonClips.id, clipId));
		return { ok: true, replaced: row.uploadId };
	});
}

/** The upload arrived whole: the clip waits for the transcoding job. */
export async function markQueued(clipId: string): Promise<void> {
	await db.update(lessonClips).set({ status: 'queued', progress: 0, updatedAt: new Date() }).where(and(eq(lessonClips.id, clipId), eq(lessonClips.status, 'uploading')));
}

/** Claims a queued clip for transcoding; false when another worker has it or it is no longer waiting. */
export async function claimForTranscoding(clipId: string): Promise<LessonClip | null> {
	const [row] = await db
		.update(lessonClips)
		.set({ status: 'transcoding', progress: 0, error: null, updatedAt: new Date() })
		.where(and(eq(lessonClips.id, clipId), inArray(lessonClips.status, ['queued', 'transcoding'])))
		.returning();
	return row ?? null;
}

export async function setProgress(clipId: string, progress: number): Promise<void> {
	await db.update(lessonClips).set({ progress }).where(and(eq(lessonClips.id, clipId), eq(lessonClips.status, 'transcoding')));
}

export async function markReady(clipId: string, done: { renditions: ClipRendition[]; poster: string; durationSeconds: number }): Promise<void> {
	await db
		.update(lessonClips)
		.set({ status: 'ready', progress: 1, error: null, uploadId: null, ...done, updatedAt: new Date() })
		.where(eq(lessonClips.id, clipId));
}

export async function markFailed(clipId: string, error: string): Promise<void> {
	await db
		.update(lessonClips)
		.set({ status: 'failed', error, uploadId: null, renditions: [], poster: null, updatedAt: new Date() })
		.where(eq(lessonClips.id, clipId));
}

export async function deleteClipRow(clipId: string): Promise<void> {
	await db.delete(lessonClips).where(eq(lessonClips.id, clipId));
}

/** Clips whose file never finished arriving (started before `before`). */
export async function abandonedClips(before: Date): Promise<LessonClip[]> {
	return db
		.select()
		.from(lessonClips)
		.where(and(eq(lessonClips.status, 'uploading'), lt(lessonClips.createdAt, before)))
		.limit(200);
}

/** Which of these ids are clips that exist (for the sweep of stray folders and upload bytes). */
export async function existingClipIds(ids: string[]): Promise<Set<string>> {
	if (ids.length === 0) return new Set();
	const rows = await db.select({ id: lessonClips.id }).from(lessonClips).where(inArray(lessonClips.id, ids));
	return new Set(rows.map((r) => r.id));
}

export async function knownClipUploads(uploadIds: string[]): Promise<Set<string>> {
	if (uploadIds.length === 0) return new Set();
	const rows = await db.select({ id: lessonClips.uploadId }).from(lessonClips).where(inArray(lessonClips.uploadId, uploadIds));
	return new Set(rows.map((r) => r.id ?? ''));
}
