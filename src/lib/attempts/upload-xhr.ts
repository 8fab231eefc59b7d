// Browser only: POSTs a form with XMLHttpRequest, whose upload events (unlike fetch) report the bytes sent so far.

export type UploadAnswer = { ok: true; status: number; body: Record<string, unknown> } | { ok: false; reason: 'network' | 'aborted' };

export function postWithProgress(url: string, body: FormData, onProgress: (loaded: number, total: number) => void, signal?: AbortSignal): Promise<UploadAnswer> {
	return new Promise((resolve) => {
		const xhr = new XMLHttpRequest();
		xhr.open('POST', url);
		xhr.responseType = 'json';
		xhr.setRequestHeader('accept', 'application/json');
		xhr.upload.onprogress = (e) => onProgress(e.loaded, e.lengthComputable ? e.total : 0);
		xhr.onload = () => {
			const parsed = xhr.response && typeof xhr.response === 'object' ? (xhr.response as Record<string, unknown>) : {};
			resolve({ ok: true, status: xhr.status, body: parsed });
		};
		xhr.onerror = () => resolve({ ok: false, reason: 'network' });
		xhr.onabort = () => resolve({ ok: false, reason: 'aborted' });
		signal?.addEventListener('abort', () => xhr.abort(), { once: true });
		xhr.send(body);
	});
}
