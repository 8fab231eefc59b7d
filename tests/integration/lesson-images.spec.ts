// Lesson images: an author's upload is stored as WebP (resized, upright) and served back; other files are refused.
import { afterAll, describe, expect, test } from 'vitest';
import sharp from 'sharp';
import { eq, inArray } from 'drizzle-orm';
import { db } from '$lib/server/db';
import { lessonImages } from '$lib/server/db/schema';
import { fileStore } from '$lib/server/storage';
import { POST } from '../../src/routes/api/v1/author/images/+server';
import { GET } from '../../src/routes/(public)/lesson-images/[file]/+server';
import { makeEvent, throughHooks, valueOf, type TestCookies } from './support/request-event';
import { demoAccount, signedInCookies } from './support/people';

const made: string[] = [];

afterAll(async () => {
	for (const id of made) await fileStore().delete(`lesson-images/${id}.webp`);
	if (made.length) await db.delete(lessonImages).where(inArray(lessonImages.id, made));
});

async function upload(cookies: TestCookies, file: Blob | null, alt: string) {
	const form = new FormData();
	if (file) form.set('file', file, 'photo');
	form.set('alt', alt);
	const event = makeEvent({ path: '/api/v1/author/images', cookies });
	Object.defineProperty(event, 'request', { value: new Request(event.url, { method: 'POST', body: form }) });
	const response = valueOf<Response>(await throughHooks(event, (e) => POST(e as never)));
	return { status: response.status, body: await response.json() };
}

const png = (width: number, height: number) =>
	sharp({ create: { width, height, channels: 3, background: { r: 240, g: 160, b: 64 } } }).png().toBuffer();

describe('lesson images', () => {
	test('a large PNG is stored as WebP within 2000 px, with Markdown for the lesson', async () => {
		const cookies = await signedInCookies(demoAccount('author').email);
		const res = await upload(cookies, new Blob([new Uint8Array(await png(3000, 1500))], { type: 'image/png' }), 'Rower at [the] dock');
		expect(res.status).toBe(201);
		made.push(res.body.id);
		expect(res.body).toMatchObject({ ok: true, width: 2000, height: 1000, url: `/lesson-images/${res.body.id}.webp` });
		expect(res.body.markdown).toBe(`![Rower at the dock](/lesson-images/${res.body.id}.webp)`);
		const row = await db.query.lessonImages.findFirst({ where: eq(lessonImages.id, res.body.id) });
		expect(row).toMatchObject({ width: 2000, height: 1000, alt: 'Rower at [the] dock', storageKey: `lesson-images/${res.body.id}.webp` });

		const served = await GET({ params: { file: `${res.body.id}.webp` } } as never);
		expect(served.headers.get('content-type')).toBe('image/webp');
		const bytes = Buffer.from(await served.arrayBuffer());
		const meta = await sharp(bytes).metadata();
		expect(meta).toMatchObject({ format: 'webp', width: 2000, height: 1000 });
	});

	test('an image taken on its side is stored upright (EXIF orientation applied)', async () => {
		const cookies = await signedInCookies(demoAccount('author').email);
		// orientation 6: the camera was turned; the stored pixels are 400 × 200 but the picture is 200 × 400
		const sideways = await sharp({ create: { width: 400, height: 200, channels: 3, background: '#3d74e0' } }).jpeg().withMetadata({ orientation: 6 }).toBuffer();
		const res = await upload(cookies, new Blob([new Uint8Array(sideways)], { type: 'image/jpeg' }), 'Climber');
		made.push(res.body.id);
		expect(res.body).toMatchObject({ width: 200, height: 400 });
	});

	test('refuses what is not a usable photo, and asks for alt text', async () => {
		const cookies = await signedInCookies(demoAccount('author').email);
		const svg = new Blob(['<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10" onload="alert(1)"/>'], { type: 'image/svg+xml' });
		expect(await upload(cookies, svg, 'x')).toMatchObject({ status: 400, body: { error: 'bad-image', message: expect.stringMatching(/not a photo we can use \(svg\)/) } });
		expect(await upload(cookies, new Blob(['just text']), 'x')).toMatchObject({ status: 400, body: { message: 'The file could not be read as an image.' } });
		expect(await upload(cookies, new Blob([]), 'x')).toMatchObject({ status: 400, body: { message: 'The file is empty.' } });
		expect(await upload(cookies, null, 'x')).toMatchObject({ status: 400, body: { message: 'Choose an image file to upload.' } });
		const okImage = new Blob([new Uint8Array(await png(10, 10))], { type: 'image/png' });
		expect(await upload(cookies, okImage, '  ')).toMatchObject({ status: 400, body: { message: expect.stringMatching(/alt text/) } });
	});

	test('refuses an upload declared larger than the limit before reading it', async () => {
		const cookies = await signedInCookies(demoAccount('author').email);
		const event = makeEvent({ path: '/api/v1/author/images', cookies });
		const huge = new Request(event.url, { method: 'POST', body: 'x', headers: { 'content-length': String(40 * 1024 * 1024), 'content-type': 'multipart/form-data; boundary=x' } });
		Object.defineProperty(event, 'request', { value: huge });
		const response = valueOf<Response>(await throughHooks(event, (e) => POST(e as never)));
		expect(response.status).toBe(413);
		expect(await response.json()).toMatchObject({ error: 'too-large', message: expect.stringMatching(/larger than 15 MB/) });
	});

	test('serves only stored images: unknown, malformed or traversing names are 404', async () => {
		for (const file of ['0123456789abcdef0123.webp', '../../etc/passwd', 'x.webp', '%2e%2e.webp']) {
			await expect(Promise.resolve().then(() => GET({ params: { file } } as never))).rejects.toMatchObject({ status: 404 });
		}
	});
});
