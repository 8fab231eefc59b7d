// What an upload says about itself (tus Upload-Metadata): the assignment, the frame and the submission key it belongs to.

export type UploadMetadata = { ok: true; assignment: string; frame: string; submissionKey: string } | { ok: false; message: string };

// same shape as the upload form's key: a browser-made UUID or another unguessable token
const SUBMISSION_KEY = /^[A-Za-z0-9_-]{8,64}$/;
const SLUG = /^[a-z0-9][a-z0-9-]{0,99}$/;

export function readUploadMetadata(metadata: Record<string, string | null> | undefined): UploadMetadata {
	const assignment = metadata?.assignment?.trim() ?? '';
	const frame = metadata?.frame?.trim() ?? '';
	const submissionKey = metadata?.submissionKey?.trim() ?? '';
	if (!SLUG.test(assignment)) return { ok: false, message: 'The upload does not say which assignment it is for.' };
	if (!frame || frame.length > 60) return { ok: false, message: 'The upload does not say which frame it is.' };
	if (!SUBMISSION_KEY.test(submissionKey)) return { ok: false, message: 'The upload is missing its submission key. Reload the page and try again.' };
	return { ok: true, assignment, frame, submissionKey };
}
