// A clip's source file by the resumable upload (the same tus endpoint as frames, Upload-Metadata `kind: clip`): only an
// author, only for a clip added and still waiting for its file, only up to the clip size limit.
import type { Upload } from '@tus/server';
import type { AuthUser } from '../auth';
import { removeUploadFiles } from '../attempts/uploads/in-transit';
import { refusal } from '../attempts/uploads/refusal';
import { isClipId } from './keys';
import { clipLimits } from './limits';
import { attachUpload, findClip, findClipByUpload, markQueued } from './records';
import { queueTranscode } from './transcode-job';

type Uploader = Pick<AuthUser, 'id' | 'roles'>;

export const isClipUpload = (metadata: Upload['metadata']) => metadata?.kind === 'clip';

const mb = (bytes: number) => Math.round(bytes / 2 ** 20);

export function clipTooLarge(size: number) {
	return refusal(413, 'too-large', `This video is ${mb(size)} MB; the limit is ${mb(clipLimits().bytes)} MB. Export a shorter or smaller version.`);
}

/** Checks the start of a clip's upload and ties it to the clip (a second start replaces the first, whose bytes go). */
export async function startClipUpload(user: Uploader, upload: Upload): Promise<void> {
	if (!user.roles.includes('author')) throw refusal(403, 'forbidden', 'Only authors may upload lesson clips.');
	const clipId = upload.metadata?.clip?.trim() ?? '';
	if (!isClipId(clipId)) throw refusal(400, 'bad-request', 'The upload does not say which clip it is for.');
	if (upload.size === undefined) throw refusal(400, 'bad-request', 'Say the size of the video when the upload starts (Upload-Length).');
	if (upload.size === 0) throw refusal(400, 'bad-request', 'This file is empty. Please choose the video again.');
	if (upload.size > clipLimits().bytes) throw clipTooLarge(upload.size);
	const clip = await findClip(clipId);
	if (!clip) throw refusal(404, 'not-found', 'There is no such clip. Add it again.');
	const attached = await attachUpload(clipId, upload.id, upload.size);
	if (!attached.ok) throw refusal(409, 'already-sent', 'This clip already has its video. Delete the clip and add it again to replace it.');
	if (attached.replaced) await removeUploadFiles(attached.replaced);
}

/** Whether `uploadId` is a clip's upload this person may resume or cancel: any author (clips are the course's, not one author's). */
export async function mayResumeClipUpload(user: Uploader, uploadId: string): Promise<boolean | null> {
	const clip = await findClipByUpload(uploadId);
	if (!clip) return null;
	return user.roles.includes('author');
}

/** The whole file arrived: queue the clip for transcoding. Returns false when the upload is not a clip's. */
export async function finishClipUpload(uploadId: string): Promise<boolean> {
	const clip = await findClipByUpload(uploadId);
	if (!clip) return false;
	await markQueued(clip.id);
	await queueTranscode(clip.id);
	return true;
}
