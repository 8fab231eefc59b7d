// Reads a request body only up to a byte limit, so a huge anonymous POST costs at most the limit in memory.

export type LimitedBody = { ok: true; bytes: Uint8Array<ArrayBuffer> } | { ok: false; reason: 'too-large' };

/** Declared length first (refused without reading), then the stream, stopped as soon as it passes `maxBytes`. */
export async function readBodyLimited(request: Request, maxBytes: number): Promise<LimitedBody> {
	const declared = Number(request.headers.get('content-length'));
	if (Number.isFinite(declared) && declared > maxBytes) {
		// not awaited: cancelling one branch of a cloned (tee'd) body settles only once both branches are cancelled
		void request.body?.cancel().catch(() => {});
		return { ok: false, reason: 'too-large' };
	}
	if (!request.body) return { ok: true, bytes: new Uint8Array(new ArrayBuffer(0)) };
	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	for (;;) {
		const { done, value } = await reader.read();
		if (done) break;
		size += value.byteLength;
		if (size > maxBytes) {
			void reader.cancel().catch(() => {});
			return { ok: false, reason: 'too-large' };
		}
		chunks.push(value);
	}
	const bytes = new Uint8Array(new ArrayBuffer(size));
	let at = 0;
	for (const c of chunks) {
		bytes.set(c, at);
		at += c.byteLength;
	}
	return { ok: true, bytes };
}

/** The body as UTF-8 text within the limit, or null when it is larger. */
export async function readTextLimited(request: Request, maxBytes: number): Promise<string | null> {
	const body = await readBodyLimited(request, maxBytes);
	return body.ok ? new TextDecoder().decode(body.bytes) : null;
}
