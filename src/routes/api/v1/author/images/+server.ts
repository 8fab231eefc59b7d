// POST /api/v1/author/images (multipart: file, alt): stores a lesson image as WebP and answers with its Markdown.
import { json } from '@sveltejs/kit';
import { firstUnstorableInForm, unstorableFormMessage } from '$lib/server/edge/unstorable';
import { checkApiAccess } from '$lib/server/guards';
import { MAX_IMAGE_BYTES, storeLessonImage } from '$lib/server/authoring/images';
import type { RequestHandler } from './$types';

const tooLarge = () =>
	json({ error: 'too-large', message: `The image is larger than ${MAX_IMAGE_BYTES / 1024 / 1024} MB: export a smaller JPEG first.` }, { status: 413 });

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals, 'author');
	if (!access.ok) return access.response;
	// refuse an oversized upload before reading it into memory (the form fields need a little room beside the file)
	const declared = Number(request.headers.get('content-length'));
	if (Number.isFinite(declared) && declared > MAX_IMAGE_BYTES + 64 * 1024) return tooLarge();
	let form: FormData;
	try {
		form = await request.formData();
	} catch (error) {
		// the server's own body limit (adapter-node BODY_SIZE_LIMIT) answers 413
		if ((error as { status?: number } | null)?.status === 413) return tooLarge();
		return json({ error: 'bad-request', message: 'Choose an image file to upload.' }, { status: 400 });
	}
	const unstorable = firstUnstorableInForm(form);
	if (unstorable) return json({ error: 'bad-input', message: unstorableFormMessage(unstorable) }, { status: 400 });
	const file = form.get('file');
	if (!(file instanceof File)) return json({ error: 'bad-request', message: 'Choose an image file to upload.' }, { status: 400 });
	const alt = String(form.get('alt') ?? '').slice(0, 200);
	if (!alt.trim()) return json({ error: 'bad-request', message: 'Describe the image in a few words (alt text) for readers who cannot see it.' }, { status: 400 });
	const stored = await storeLessonImage(new Uint8Array(await file.arrayBuffer()), alt, access.user.id);
	if (!stored.ok) return json({ error: 'bad-image', message: stored.message }, { status: 400 });
	return json(stored, { status: 201 });
};
