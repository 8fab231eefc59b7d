// The author's side of clips: adding one (before its video is sent), reading its state while it is prepared, deleting it.
import { eq } from 'drizzle-orm';
import { normaliseCaptions } from '../../clips/webvtt';
import type { ClipInput } from '../../forms/clips';
import type { ClipCard } from '../../lessons/page-data';
import { removeUploadFiles } from '../attempts/uploads/in-transit';
import { db } from '../db/index';
import { lessons } from '../db/schema';
import { fileStore } from '../storage/index';
import { clipFolder } from './keys';
import { createClip, deleteClipRow, findClip } from './records';
import { clipCard } from './view';

export type AddClip = { ok: true; id: string } | { ok: false; status: 404 | 409; message: string };

export async function addClip(userId: string, input: ClipInput): Promise<AddClip> {
	const [lesson] = await db.select({ id: lessons.id }).from(lessons).where(eq(lessons.id, input.lesson)).limit(1);
	if (!lesson) return { ok: false, status: 404, message: 'There is no such lesson.' };
	const id = await createClip({ lessonId: lesson.id, name: input.name, title: input.title, captions: normaliseCaptions(input.captions), createdBy: userId });
	if (!id) return { ok: false, status: 409, message: `This lesson already has a clip named “${input.name}”. Choose another name, or delete that clip first.` };
	return { ok: true, id };
}

export async function clipState(id: string): Promise<ClipCard | null> {
	const clip = await findClip(id);
	return clip ? clipCard(clip) : null;
}

/** Removes a clip: its row, its stored files and any upload still on its way. A job still running finds no row and its files go by the sweep. */
export async function deleteClip(id: string): Promise<boolean> {
	const clip = await findClip(id);
	if (!clip) return false;
	await deleteClipRow(id);
	await fileStore().deletePrefix(clipFolder(id));
	if (clip.uploadId) await removeUploadFiles(clip.uploadId);
	return true;
}
