// POST makes the Attempt from frames already sent by resumable upload: the upload form's fields without the files.
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { attemptAnswer } from '$lib/server/attempts/answer';
import { readUploadForm } from '$lib/server/attempts/upload-form';
import { submitUploaded } from '$lib/server/attempts/uploads/submit-uploaded';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals);
	if (!access.ok) return access.response;
	let data: FormData;
	try {
		// a small form: the input gate has bounded it and checked its text already
		data = await request.formData();
	} catch {
		return json({ error: 'bad-request', message: 'Send the upload form’s fields (the upload page does this).' }, { status: 400 });
	}
	const form = readUploadForm(data);
	if (!form.ok) return json({ error: 'bad-request', message: form.message }, { status: 400 });
	const { files: _files, ...fields } = form.form;
	return attemptAnswer(await submitUploaded(access.user, fields));
};
