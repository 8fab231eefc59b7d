// The one gate for what a request carries: bodies bounded before anything parses them, and text PostgreSQL or the
// product cannot store (NUL, control characters, broken UTF-16) refused with a clear 400 before any route sees it.
import { json, type Handle, type RequestEvent } from '@sveltejs/kit';
import { readBodyLimited } from './read-body';
import { describeUnstorable, firstUnstorableInForm, firstUnstorableInJson, unstorableFormMessage } from './unstorable';

/**
 * Routes that read (and bound) their own bodies: the frame and image uploads (too large to read twice; they run
 * `firstUnstorableInForm` on what they parse), the resumable upload's parts (bytes of a photo, bounded by the upload's
 * declared size, which its metadata check keeps within the frame limit) and the signed webhook (which records a bad
 * event as rejected).
 */
export const ownBodyRoutes = new Set([
	'/api/v1/attempts',
	'/api/v1/uploads',
	'/api/v1/uploads/[id]',
	'/api/v1/author/images',
	'/api/v1/author/spec-trial',
	'/api/v1/payments/webhook'
]);

/** Every other form or API body: room for the longest lesson text (100 000 characters, percent-encoded) and more. */
export const maxFormBytes = 2 * 1024 * 1024;

const bodyless = new Set(['GET', 'HEAD', 'OPTIONS']);

export const guardInput: Handle = async ({ event, resolve }) => {
	const inAddress = addressProblem(event);
	if (inAddress) return refuse(event, 400, `The address contains ${inAddress}, which we cannot accept. Remove it and try again.`);
	// these routes have no parameters, so the path names them even where no route matched (a 404 reads no body)
	if (!bodyless.has(event.request.method) && !ownBodyRoutes.has(event.route.id ?? event.url.pathname)) {
		const problem = await bodyProblem(event.request);
		if (problem === 'too-large') {
			void event.request.body?.cancel().catch(() => {});
			return refuse(event, 413, 'The form is larger than we accept.');
		}
		if (problem) return refuse(event, 400, unstorableFormMessage(problem));
	}
	return resolve(event);
};

function addressProblem(event: RequestEvent): string | null {
	let path: string;
	try {
		path = decodeURIComponent(event.url.pathname);
	} catch {
		return 'a broken escape sequence';
	}
	const params = Object.values(event.params ?? {}).filter((v): v is string => typeof v === 'string');
	const query = [...event.url.searchParams].flat();
	for (const text of [path, ...params, ...query]) {
		const found = describeUnstorable(text);
		if (found) return found;
	}
	return null;
}

/** Looks at a copy of the body (the route still reads the original), within the size limit. */
async function bodyProblem(request: Request): Promise<string | 'too-large' | null> {
	const body = await readBodyLimited(request.clone(), maxFormBytes);
	if (!body.ok) return 'too-large';
	if (body.bytes.byteLength === 0) return null;
	const type = request.headers.get('content-type')?.toLowerCase() ?? '';
	const text = new TextDecoder().decode(body.bytes);
	if (type.startsWith('application/x-www-form-urlencoded')) {
		const form = new URLSearchParams(text);
		return firstUnstorableInJson([...form].flat()) ?? escapedInSuperformJson(form);
	}
	if (type.startsWith('multipart/form-data')) {
		try {
			const form = await new Response(body.bytes, { headers: { 'content-type': type } }).formData();
			return firstUnstorableInForm(form) ?? escapedInSuperformJson(form);
		} catch {
			return null; // not parseable: the route answers that itself
		}
	}
	if (type.includes('json')) {
		try {
			return firstUnstorableInJson(JSON.parse(text));
		} catch {
			return null;
		}
	}
	return describeUnstorable(text);
}

/**
 * superforms posts nested data (a rubric, a record) as one devalue-encoded JSON field, where a control character is
 * written as an escape (\u0000): look for those escapes too.
 */
function escapedInSuperformJson(form: FormData | URLSearchParams): string | null {
	const packed = form.get('__superform_json');
	if (typeof packed !== 'string') return null;
	const escape = /(?<!\\)\\u(00(?:0[0-8bcef]|1[0-9a-f]|7f)|d[89ab][0-9a-f]{2}(?!\\ud[c-f]))/i.exec(packed);
	return escape ? describeUnstorable(String.fromCharCode(parseInt(escape[1], 16))) : null;
}

/**
 * Answers in the form the caller understands: a form action's error result (the page shows the error view), JSON
 * for API and data requests, otherwise a plain error page.
 */
function refuse(event: RequestEvent, status: number, message: string): Response {
	const error = status === 413 ? 'too-large' : 'bad-input';
	if (event.request.headers.get('x-sveltekit-action') === 'true') {
		return json({ type: 'error', error: { message } }, { status });
	}
	const accept = event.request.headers.get('accept') ?? '';
	if (event.url.pathname.startsWith('/api/') || event.isDataRequest || (accept.includes('application/json') && !accept.includes('text/html'))) {
		return json({ error, message }, { status });
	}
	return new Response(page(status, message), { status, headers: { 'content-type': 'text/html; charset=utf-8' } });
}

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function page(status: number, message: string): string {
	return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${status} · Stopwise</title>
<style>body{margin:0;font:16px/1.5 system-ui,sans-serif;background:#1f2124;color:#e8e6e3}main{max-width:32rem;margin:4rem auto;padding:0 1rem}a{color:#e0a040}</style></head>
<body><main><h1>Stopwise could not use that request</h1><p>${escapeHtml(message)}</p><p><a href="/">Stopwise home</a></p></main></body></html>`;
}
