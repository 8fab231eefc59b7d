// POST /api/v1/author/preview: renders lesson Markdown exactly as learners will get it (segments + problems), for authors.
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { MAX_BODY_LENGTH } from '$lib/forms/authoring';
import { checkApiAccess } from '$lib/server/guards';
import { renderLessonMarkdown } from '$lib/server/lessons/render';
import type { RequestHandler } from './$types';

const previewSchema = z.object({ body: z.string().max(MAX_BODY_LENGTH) });

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals, 'author');
	if (!access.ok) return access.response;
	const parsed = previewSchema.safeParse(await request.json().catch(() => null));
	if (!parsed.success) {
		return json({ error: 'bad-request', message: `Send {"body": "<Markdown>"}, at most ${MAX_BODY_LENGTH} characters.` }, { status: 400 });
	}
	const { segments, problems } = await renderLessonMarkdown(parsed.data.body);
	return json({ segments, problems });
};
