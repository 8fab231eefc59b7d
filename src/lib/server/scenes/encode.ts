// Linear frames to pictures: clip, encode with the sRGB transfer function (IEC 61966-2-1), lay panels side by side, WebP.
import sharp from 'sharp';
import { srgbEncode } from '../../exposure/srgb';
import type { LinearFrame } from './render';

/** 8-bit sRGB pixels, three bytes each. */
export interface Picture {
	width: number;
	height: number;
	data: Uint8Array;
}

/** Clips linear light to 0–1 (the sensor's full well) and encodes each channel to 8-bit sRGB. */
export function encodeSrgb(frame: LinearFrame): Picture {
	const out = new Uint8Array(frame.data.length);
	for (let i = 0; i < frame.data.length; i++) {
		const v = Math.min(1, Math.max(0, frame.data[i]));
		out[i] = Math.round(srgbEncode(v) * 255);
	}
	return { width: frame.width, height: frame.height, data: out };
}

/** Pixels of page colour between panels. */
export const GUTTER = 6;

/** Pictures of equal height side by side with a `gap`-pixel charcoal gutter between them. */
export function sideBySide(pictures: Picture[], gap = GUTTER): Picture {
	const height = pictures[0].height;
	if (pictures.some((p) => p.height !== height)) throw new Error('panels must share one height');
	const width = pictures.reduce((w, p) => w + p.width, 0) + gap * (pictures.length - 1);
	const data = new Uint8Array(width * height * 3);
	// the site's charcoal (#1b1d21) between panels, so the gutter reads as page, not picture
	for (let i = 0; i < data.length; i += 3) data.set([0x1b, 0x1d, 0x21], i);
	let x0 = 0;
	for (const p of pictures) {
		for (let y = 0; y < height; y++) data.set(p.data.subarray(y * p.width * 3, (y + 1) * p.width * 3), (y * width + x0) * 3);
		x0 += p.width + gap;
	}
	return { width, height, data };
}

/** WebP bytes of a picture: lossy, quality chosen to keep lesson figures small; libwebp is deterministic for fixed input. */
export async function toWebp(picture: Picture, quality = 74): Promise<Buffer> {
	return sharp(Buffer.from(picture.data.buffer, picture.data.byteOffset, picture.data.byteLength), {
		raw: { width: picture.width, height: picture.height, channels: 3 }
	})
		.webp({ quality, effort: 6, smartSubsample: true })
		.toBuffer();
}
