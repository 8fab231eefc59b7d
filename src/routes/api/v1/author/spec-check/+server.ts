// POST /api/v1/author/spec-check: validates Assignment spec text as typed; errors by path, criteria in plain words.
import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { checkApiAccess } from '$lib/server/guards';
import { checkSpecText } from '$lib/server/authoring/assignments';
import type { RequestHandler } from './$types';

const checkSchema = z.object({ spec: z.string().max(50_000) });

export const POST: RequestHandler = async ({ locals, request }) => {
	const access = checkApiAccess(locals, 'author');
	if (!access.ok) return access.response;
	const parsed = checkSchema.safeParse(await request.json().catch(() => null));
	if (!parsed.success) return json({ error: 'bad-request', message: 'Send {"spec": "<JSON text>"}.' }, { status: 400 });
	return json(checkSpecText(parsed.data.spec));
};
