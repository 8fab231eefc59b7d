// POST a new Attempt: multipart form with the frames (one request, so the browser can show per-file progress).
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { maxRequestBytes } from '$lib/server/attempts/limits';
import { firstUnstorableInForm, unstorableFormMessage } from '$lib/server/edge/unstorable';
import { readUploadForm } from '$lib/server/attempts/upload-form';
import { submitAttempt } from '$lib/server/attempts/submit';
import type { RequestHandler } from './$types';

// the most frames a spec may list (assignmentSpecSchema)
const MAX_FRAMES = 12;

const tooLarge = () =>
	json({ error: 'too-large', message: 'The upload is larger than we accept. Each frame may be at most the size shown on the page.' }, { status: 413 });

function payloadTooLarge(error: unknown): boolean {
	return typeof error === 'object' && error !== null && (error as { status?: number }).status === 413;
}

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	const declared = Number(request.headers.get('content-length'));
	if (Number.isFinite(declared) && declared > maxRequestBytes(MAX_FRAMES)) return tooLarge();

	let data: FormData;
	try {
		data = await request.formData();
	} catch (error) {
		if (payloadTooLarge(error)) return tooLarge();
		return json({ error: 'bad-request', message: 'Send the frames as a multipart form (the upload page does this).' }, { status: 400 });
	}
	const unstorable = firstUnstorableInForm(data);
	if (unstorable) return json({ error: 'bad-input', message: unstorableFormMessage(unstorable) }, { status: 400 });
	const form = readUploadForm(data);
	if (!form.ok) return json({ error: 'bad-request', message: form.message }, { status: 400 });

	const result = await submitAttempt(access.user, form.form);
	switch (result.kind) {
		case 'created':
			return json({ id: result.id, href: `/attempts/${result.id}` }, { status: 201 });
		case 'duplicate':
			return json({ id: result.id, href: `/attempts/${result.id}`, duplicate: true }, { status: 200 });
		case 'not-found':
			return json({ error: 'not-found', message: 'There is no such assignment.' }, { status: 404 });
		case 'not-enrolled':
			return json({ error: 'not-enrolled', message: 'Enrol in this course to upload its assignments.' }, { status: 403 });
		case 'invalid':
			return json({ error: 'invalid-frames', message: result.message, frames: result.frames }, { status: 422 });
		case 'unavailable':
			return json({ error: 'unavailable', message: result.message }, { status: 503 });
	}
};
