// POST a new Attempt in one multipart request (scripts and the API; the upload page sends frames by resumable upload
// and then posts to ./from-uploads). The body streams to disk: no frame is held in memory while it arrives.
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { maxRequestBytes, maxUploadBytes } from '$lib/server/attempts/limits';
import { firstUnstorableInForm, unstorableFormMessage } from '$lib/server/edge/unstorable';
import { readUploadForm } from '$lib/server/attempts/upload-form';
import { submitAttempt } from '$lib/server/attempts/submit';
import { attemptAnswer } from '$lib/server/attempts/answer';
import { readMultipartToDisk } from '$lib/server/attempts/multipart-to-disk';
import type { RequestHandler } from './$types';

// the most frames a spec may list (assignmentSpecSchema)
const MAX_FRAMES = 12;

const tooLarge = (message = 'The upload is larger than we accept. Each frame may be at most the size shown on the page.') => json({ error: 'too-large', message }, { status: 413 });

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	const declared = Number(request.headers.get('content-length'));
	if (Number.isFinite(declared) && declared > maxRequestBytes(MAX_FRAMES)) {
		void request.body?.cancel().catch(() => undefined);
		return tooLarge();
	}

	const read = await readMultipartToDisk(request, { fileBytes: maxUploadBytes(), files: MAX_FRAMES, fields: 20, fieldBytes: 256 * 1024 });
	if (!read.ok) {
		if (read.reason === 'too-large') return tooLarge(read.message);
		if (read.reason === 'too-many-files') return json({ error: 'too-many-parts', message: read.message }, { status: 422 });
		return json({ error: 'bad-request', message: read.message }, { status: 400 });
	}
	try {
		const unstorable = firstUnstorableInForm(read.data);
		if (unstorable) return json({ error: 'bad-input', message: unstorableFormMessage(unstorable) }, { status: 400 });
		const form = readUploadForm(read.data);
		if (!form.ok) return json({ error: 'bad-request', message: form.message }, { status: 400 });
		return attemptAnswer(await submitAttempt(access.user, form.form));
	} finally {
		await read.cleanup();
	}
};
