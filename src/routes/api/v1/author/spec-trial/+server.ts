// POST /api/v1/author/spec-trial: grades sample frames against spec text as a learner's Attempt would be; stores nothing.
// The form streams to temporary files (no frame held in memory while it arrives), removed when the trial is done.
import { json } from '@sveltejs/kit';
import { checkApiAccess } from '$lib/server/guards';
import { firstUnstorableInForm, unstorableFormMessage } from '$lib/server/edge/unstorable';
import { trySpec } from '$lib/server/attempts/trial';
import { maxRequestBytes, maxUploadBytes } from '$lib/server/attempts/limits';
import { readMultipartToDisk } from '$lib/server/attempts/multipart-to-disk';
import type { RequestHandler } from './$types';

const MAX_FRAMES = 12;

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals, 'author');
	if (!access.ok) return access.response;
	const declared = Number(request.headers.get('content-length') ?? 0);
	if (declared > maxRequestBytes(MAX_FRAMES)) return json({ error: 'too-large', message: 'These files are too large to try at once.' }, { status: 413 });
	const read = await readMultipartToDisk(request, { fileBytes: maxUploadBytes(), files: MAX_FRAMES, fields: 8, fieldBytes: 256 * 1024 });
	if (!read.ok) {
		if (read.reason === 'too-large' || read.reason === 'too-many-files') return json({ error: 'too-large', message: read.message }, { status: 413 });
		return json({ error: 'bad-request', message: 'Send the spec and the frames as a form upload.' }, { status: 400 });
	}
	try {
		const data = read.data;
		const unstorable = firstUnstorableInForm(data);
		if (unstorable) return json({ error: 'bad-input', message: unstorableFormMessage(unstorable) }, { status: 400 });
		const spec = data.get('spec');
		if (typeof spec !== 'string' || spec.length > 50_000) return json({ error: 'bad-request', message: 'Send the spec text (at most 50,000 characters).' }, { status: 400 });
		const files: Record<string, File> = {};
		for (const [key, value] of data.entries()) if (key.startsWith('frame:') && value instanceof File) files[key.slice(6)] = value;
		const outcome = await trySpec(spec, files);
		if (!outcome.ok) return json({ error: 'refused', message: outcome.message, specErrors: outcome.specErrors ?? [] }, { status: outcome.status });
		return json(outcome);
	} finally {
		await read.cleanup();
	}
};
