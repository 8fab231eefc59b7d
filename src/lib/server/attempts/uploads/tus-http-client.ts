// For tests and benches: a minimal tus client over fetch, as the upload page's (create, then PATCH parts), that can send
// each request of one frame to another app process, as a proxy in front of several nodes may; and the attempt made from
// the finished frames.
import { UPLOAD_PART_BYTES } from '../../../attempts/upload-parts';

/** Who sends: the session cookie and the Origin header the app expects (its ORIGIN). */
export interface TusSender {
	cookie: string;
	origin: string;
}

const b64 = (s: string) => Buffer.from(s).toString('base64');

/**
 * Sends one frame: the POST to `nodes[0]`, then each part to the next node in turn (`nodes[1]`, `nodes[2]`, … round
 * the list). Throws with the app's answer when a request is refused.
 */
export async function sendFrame(
	nodes: readonly string[],
	sender: TusSender,
	upload: { assignment: string; frame: string; submissionKey: string; bytes: Buffer; partBytes?: number }
): Promise<void> {
	const headers = { cookie: sender.cookie, origin: sender.origin, 'tus-resumable': '1.0.0' };
	const metadata = `assignment ${b64(upload.assignment)},frame ${b64(upload.frame)},submissionKey ${b64(upload.submissionKey)}`;
	const created = await fetch(`${nodes[0]}/api/v1/uploads`, {
		method: 'POST',
		headers: { ...headers, 'upload-length': String(upload.bytes.length), 'upload-metadata': metadata }
	});
	if (created.status !== 201) throw new Error(`upload start answered ${created.status}: ${await created.text()}`);
	const path = new URL(created.headers.get('location')!, nodes[0]).pathname;
	const partBytes = upload.partBytes ?? UPLOAD_PART_BYTES;
	for (let offset = 0, part = 1; offset < upload.bytes.length; part++) {
		const node = nodes[part % nodes.length];
		const sent = await fetch(`${node}${path}`, {
			method: 'PATCH',
			headers: { ...headers, 'upload-offset': String(offset), 'content-type': 'application/offset+octet-stream' },
			body: new Uint8Array(upload.bytes.subarray(offset, offset + partBytes))
		});
		if (sent.status !== 204) throw new Error(`part at ${offset} (${node}) answered ${sent.status}: ${await sent.text()}`);
		offset = Number(sent.headers.get('upload-offset'));
	}
}

/** Makes the attempt from a submission's finished frames; returns its id. */
export async function makeAttemptFromUploads(node: string, sender: TusSender, fields: { assignment: string; submissionKey: string }): Promise<string> {
	const form = new FormData();
	form.append('assignment', fields.assignment);
	form.append('submissionKey', fields.submissionKey);
	const answer = await fetch(`${node}/api/v1/attempts/from-uploads`, { method: 'POST', headers: { cookie: sender.cookie, origin: sender.origin, accept: 'application/json' }, body: form });
	const body = (await answer.json()) as { id?: string; message?: string };
	if (answer.status !== 201 || !body.id) throw new Error(`making the attempt answered ${answer.status}: ${body.message ?? ''}`);
	return body.id;
}
