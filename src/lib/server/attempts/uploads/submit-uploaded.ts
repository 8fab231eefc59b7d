// Makes the attempt from frames sent ahead by resumable upload: every frame arrived, then the same checks and the same
// one-transaction store as a single request; the uploads are removed once their attempt exists.
import type { AuthUser } from '../../auth';
import { findAssignment } from '../assignment';
import { existingAttemptId, submitAttempt, type SubmitResult } from '../submit';
import type { UploadForm } from '../upload-form';
import { removeUploadFiles, uploadedFile } from './in-transit';
import { deleteUploadRows, uploadsOfSubmission } from './records';

async function forget(ids: readonly string[]): Promise<void> {
	await deleteUploadRows(ids);
	await Promise.all(ids.map((id) => removeUploadFiles(id).catch(() => undefined)));
}

/** `form` carries everything but the files; they are the finished uploads of its submission key. */
export async function submitUploaded(user: Pick<AuthUser, 'id' | 'roles'>, form: Omit<UploadForm, 'files'>): Promise<SubmitResult> {
	const assignment = await findAssignment(form.assignmentSlug);
	if (!assignment) return { kind: 'not-found' };
	const rows = (await uploadsOfSubmission(user.id, form.submissionKey)).filter((r) => r.assignmentId === assignment.id);
	const earlier = await existingAttemptId(user.id, form.submissionKey);
	if (earlier) {
		await forget(rows.map((r) => r.id));
		return { kind: 'duplicate', id: earlier };
	}
	const unfinished: Record<string, string> = {};
	for (const row of rows) {
		if (!row.finishedAt) unfinished[row.frameName] = 'This frame has not finished uploading. Keep the page open until it reaches 100 %.';
	}
	if (Object.keys(unfinished).length) return { kind: 'invalid', message: 'Some frames are still uploading. Nothing was stored yet.', frames: unfinished };

	const files = new Map<string, File>();
	// copies made on this node's disk when the uploads wait in the bucket: removed whatever happens
	const releases: (() => Promise<void>)[] = [];
	let result: SubmitResult;
	try {
		for (const row of rows) {
			const found = await uploadedFile(row.id, row.frameName, row.size);
			if (!found) continue;
			files.set(row.frameName, found.file);
			releases.push(found.release);
		}
		result = await submitAttempt(user, { ...form, files });
	} catch (error) {
		// a twin request that stored the attempt first removes these files while they are read: answer with its attempt
		const twin = await existingAttemptId(user.id, form.submissionKey);
		if (twin) return { kind: 'duplicate', id: twin };
		throw error;
	} finally {
		await Promise.all(releases.map((release) => release().catch(() => undefined)));
	}
	if (result.kind === 'created' || result.kind === 'duplicate') await forget(rows.map((r) => r.id));
	return result;
}
