// The two multipart-upload calls s3rver lacks, answered from the parts s3rver itself keeps: ListParts (GET
// /<bucket>/<key>?uploadId=…) and AbortMultipartUpload (DELETE /<bucket>/<key>?uploadId=…). Resumable uploads kept in a
// bucket need both: how much of an upload arrived is the sum of its parts. Path-style addressing only, like the fake.
import { createHash } from 'node:crypto';
import { readdir, readFile, rm, stat } from 'node:fs/promises';
import { join } from 'node:path';

/** @type {Record<string, string>} */
const ENTITIES = { '<': '&lt;', '>': '&gt;', '&': '&amp;', "'": '&apos;', '"': '&quot;' };
/** @param {string | number} s */
const xmlEscape = (s) => String(s).replace(/[<>&'"]/g, (c) => ENTITIES[c] ?? c);

/**
 * @typedef {{ store: { getResourcePath(bucket: string, key: undefined, resource: string): string }; middleware: unknown[] }} S3rverInside
 * @typedef {{ query: Record<string, unknown>; method: string; path: string; status: number; type: string; body: unknown }} Context
 */

/** @param {string} code @param {string} message */
function errorXml(code, message) {
	return `<?xml version="1.0" encoding="UTF-8"?>\n<Error><Code>${code}</Code><Message>${xmlEscape(message)}</Message></Error>`;
}

/**
 * The upload's folder in s3rver's own layout, or null when no such upload is in progress (completed or aborted).
 * @param {S3rverInside} server @param {string} bucket @param {string} uploadId
 */
async function uploadFolder(server, bucket, uploadId) {
	if (!/^[a-f0-9]{32}$/.test(uploadId)) return null;
	const folder = join(server.store.getResourcePath(bucket, undefined, 'uploads'), uploadId);
	const found = await stat(folder).catch(() => null);
	return found?.isDirectory() ? folder : null;
}

/** @param {string} folder */
async function listParts(folder) {
	const names = (await readdir(folder)).filter((n) => /^\d+$/.test(n));
	const parts = [];
	for (const name of names) {
		const info = await stat(join(folder, name));
		const md5 = await readFile(join(folder, `${name}.md5`), 'utf8').catch(async () => createHash('md5').update(await readFile(join(folder, name))).digest('hex'));
		parts.push({ number: Number(name), size: info.size, etag: md5.trim(), modified: info.mtime });
	}
	return parts.sort((a, b) => a.number - b.number);
}

/**
 * Adds ListParts and AbortMultipartUpload to an S3rver (a Koa app), ahead of its own routes; call before `run()`.
 * @template T
 * @param {T} s3rver
 * @returns {T}
 */
export function addMultipartCalls(s3rver) {
	const server = /** @type {S3rverInside} */ (/** @type {unknown} */ (s3rver));
	/** @param {Context} ctx @param {() => Promise<void>} next */
	const handler = async (ctx, next) => {
		const uploadId = ctx.query.uploadId;
		const method = ctx.method;
		if (typeof uploadId !== 'string' || (method !== 'GET' && method !== 'DELETE')) return next();
		const [, bucket, ...rest] = ctx.path.split('/');
		const key = decodeURIComponent(rest.join('/'));
		if (!bucket || !key) return next();
		const folder = await uploadFolder(server, bucket, uploadId);
		if (!folder) {
			ctx.status = 404;
			ctx.type = 'application/xml';
			ctx.body = errorXml('NoSuchUpload', 'The specified upload does not exist.');
			return;
		}
		if (method === 'DELETE') {
			await rm(folder, { recursive: true, force: true });
			ctx.status = 204;
			return;
		}
		const parts = await listParts(folder);
		ctx.type = 'application/xml';
		ctx.body = [
			'<?xml version="1.0" encoding="UTF-8"?>',
			'<ListPartsResult>',
			`<Bucket>${xmlEscape(bucket)}</Bucket><Key>${xmlEscape(key)}</Key><UploadId>${uploadId}</UploadId>`,
			`<PartNumberMarker>0</PartNumberMarker><NextPartNumberMarker>${parts.at(-1)?.number ?? 0}</NextPartNumberMarker>`,
			`<MaxParts>10000</MaxParts><IsTruncated>false</IsTruncated>`,
			...parts.map((p) => `<Part><PartNumber>${p.number}</PartNumber><LastModified>${p.modified.toISOString()}</LastModified><ETag>"${p.etag}"</ETag><Size>${p.size}</Size></Part>`),
			'</ListPartsResult>'
		].join('');
	};
	// before the router (the last middleware), after logging and the response encoding
	server.middleware.splice(server.middleware.length - 1, 0, handler);
	return s3rver;
}
