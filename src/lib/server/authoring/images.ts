// Lesson images: an upload is checked, turned upright, resized and kept as WebP in the file store (lesson-images/<id>.webp).
import { randomBytes } from 'node:crypto';
import sharp from 'sharp';
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { lessonImages } from '../db/schema';
import { fileStore, type StoredStream } from '../storage';

export const MAX_IMAGE_BYTES = 15 * 1024 * 1024;
// wide enough for a sharp full-width figure on a high-density screen, small enough to load in the field
const MAX_EDGE = 2000;
const ACCEPTED_FORMATS = new Set(['jpeg', 'png', 'webp', 'gif', 'tiff', 'heif', 'avif']);
const ID_PATTERN = /^[a-f0-9]{20}$/;

export function lessonImageUrl(id: string): string {
	return `/lesson-images/${id}.webp`;
}

/** Markdown for an uploaded image; brackets in the alt text would end the link text early. */
export function imageMarkdown(id: string, alt: string): string {
	return `![${alt.replace(/[[\]\\]/g, '').trim()}](${lessonImageUrl(id)})`;
}

export type StoredImage = { ok: true; id: string; url: string; markdown: string; width: number; height: number } | { ok: false; message: string };

export async function storeLessonImage(bytes: Uint8Array, alt: string, authorId: string): Promise<StoredImage> {
	if (bytes.byteLength === 0) return { ok: false, message: 'The file is empty.' };
	if (bytes.byteLength > MAX_IMAGE_BYTES) return { ok: false, message: `The file is over ${MAX_IMAGE_BYTES / 1024 / 1024} MB: export a smaller JPEG first.` };
	let webp: { data: Buffer; info: { width: number; height: number } };
	try {
		// a decompression bomb stops at the pixel limit instead of filling memory
		const input = sharp(bytes, { limitInputPixels: 100_000_000 });
		const { format } = await input.metadata();
		if (!format || !ACCEPTED_FORMATS.has(format)) {
			return { ok: false, message: `That is not a photo we can use${format ? ` (${format})` : ''}: upload a JPEG, PNG, WebP, GIF, TIFF, HEIF or AVIF.` };
		}
		webp = await input
			.rotate()
			.resize({ width: MAX_EDGE, height: MAX_EDGE, fit: 'inside', withoutEnlargement: true })
			.webp({ quality: 82 })
			.toBuffer({ resolveWithObject: true });
	} catch {
		return { ok: false, message: 'The file could not be read as an image.' };
	}

	const id = randomBytes(10).toString('hex');
	const key = `lesson-images/${id}.webp`;
	await fileStore().put(key, webp.data);
	try {
		await db.insert(lessonImages).values({ id, authorId, storageKey: key, width: webp.info.width, height: webp.info.height, alt: alt.trim() });
	} catch (e) {
		// no row, no file: a stored image is always one an author can find
		await fileStore().delete(key);
		throw e;
	}
	return { ok: true, id, url: lessonImageUrl(id), markdown: imageMarkdown(id, alt), width: webp.info.width, height: webp.info.height };
}

/** The stored WebP for `<id>.webp` as a stream, or null for anything that is not one of our images. */
export async function readLessonImage(file: string): Promise<StoredStream | null> {
	const id = file.endsWith('.webp') ? file.slice(0, -'.webp'.length) : '';
	if (!ID_PATTERN.test(id)) return null;
	const row = await db.query.lessonImages.findFirst({ where: eq(lessonImages.id, id) });
	if (!row) return null;
	return fileStore().open(row.storageKey);
}
