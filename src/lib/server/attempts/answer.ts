// One JSON answer for every way an attempt is sent (one multipart request, or frames sent ahead by resumable upload).
import { json } from '@sveltejs/kit';
import type { SubmitResult } from './submit';

export function attemptAnswer(result: SubmitResult): Response {
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
		case 'too-many-parts':
			return json({ error: 'too-many-parts', message: result.message }, { status: 422 });
		case 'unavailable':
			return json({ error: 'unavailable', message: result.message }, { status: 503 });
	}
}
