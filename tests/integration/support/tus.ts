// Resumable uploads (tus) sent through the app's input gate and session hook into the upload routes, as a browser's
// tus client would: start, parts, and the attempt made from the finished frames.
import { expect } from 'vitest';
import { POST as create, DELETE as cancelAll } from '../../../src/routes/api/v1/uploads/+server';
import { DELETE, HEAD, PATCH } from '../../../src/routes/api/v1/uploads/[id]/+server';
import { POST as finish } from '../../../src/routes/api/v1/attempts/from-uploads/+server';
import { makeEvent, throughHooks, type TestCookies } from './request-event';
import { ASSIGNMENT } from './attempts';

const b64 = (s: string) => Buffer.from(s).toString('base64');
const metadata = (m: Record<string, string>) =>
	Object.entries(m)
		.map(([k, v]) => `${k} ${b64(v)}`)
		.join(',');

/** Runs one tus request through the app's input gate and session hook, into the route's handler. */
export async function tus(method: string, path: string, cookies: TestCookies | undefined, headers: Record<string, string>, body?: BodyInit) {
	const single = !/^\/api\/v1\/uploads(\?|$)/.test(path);
	const event = makeEvent({ method, path, cookies, routeId: single ? '/api/v1/uploads/[id]' : '/api/v1/uploads', params: single ? { id: path.split('/').pop()! } : {} });
	const url = new URL(path, event.url.origin);
	(event as { request: Request }).request = new Request(url, {
		method,
		body,
		headers: { origin: url.origin, 'tus-resumable': '1.0.0', ...headers },
		...(body instanceof ReadableStream ? { duplex: 'half' } : {})
	} as RequestInit);
	const handler = single ? { HEAD, PATCH, DELETE }[method as 'PATCH'] : { POST: create, DELETE: cancelAll }[method as 'POST'];
	const outcome = await throughHooks(event, (e) => handler(e as never));
	if (outcome.kind !== 'value') throw new Error(`unexpected ${JSON.stringify(outcome)}`);
	const response = outcome.value as Response;
	return { status: response.status, headers: response.headers, text: await response.text() };
}

export async function start(cookies: TestCookies, frame: string, size: number, submissionKey: string, assignment = ASSIGNMENT) {
	return tus('POST', '/api/v1/uploads', cookies, { 'upload-length': String(size), 'upload-metadata': metadata({ assignment, frame, submissionKey, filename: `${frame}.jpg` }) });
}

export async function sendParts(cookies: TestCookies, location: string, bytes: Buffer, part: number, from = 0) {
	let offset = from;
	while (offset < bytes.length) {
		const chunk = bytes.subarray(offset, offset + part);
		const answer = await tus('PATCH', location, cookies, { 'upload-offset': String(offset), 'content-type': 'application/offset+octet-stream' }, new Uint8Array(chunk));
		expect(answer.status).toBe(204);
		offset = Number(answer.headers.get('upload-offset'));
	}
	return offset;
}

export async function uploadFrame(cookies: TestCookies, frame: string, bytes: Buffer, submissionKey: string, part = 16 * 1024) {
	const created = await start(cookies, frame, bytes.length, submissionKey);
	expect(created.status).toBe(201);
	const location = created.headers.get('location')!;
	expect(await sendParts(cookies, location, bytes, part)).toBe(bytes.length);
	return location;
}

export async function finishAttempt(cookies: TestCookies, submissionKey: string) {
	const event = makeEvent({ method: 'POST', path: '/api/v1/attempts/from-uploads', cookies, form: { assignment: ASSIGNMENT, submissionKey, subjectBox: '0.3,0.2,0.4,0.6' } });
	const outcome = await throughHooks(event, (e) => finish(e as never));
	if (outcome.kind !== 'value') throw new Error(`unexpected ${JSON.stringify(outcome)}`);
	return { status: outcome.value.status, body: await outcome.value.json() };
}

export const idOf = (location: string) => location.split('/').pop()!;
