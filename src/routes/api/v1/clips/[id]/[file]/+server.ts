// GET a lesson clip's file (720.mp4, 360.mp4, poster.jpg, captions.vtt): the lesson's access rule, byte ranges for the videos.
import { clipFileResponse } from '$lib/server/clips/serve';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = ({ locals, params, request }) => clipFileResponse(locals.user ?? null, params.id, params.file, request.headers.get('range'));
