// Linear 16-bit RGB images (decoded raw files): shrinking by whole blocks in linear light, and an 8-bit sRGB rendering to show.
import { srgbEncode } from '../../exposure/index';
import { RAW_TO_SCENE_GAIN } from './raw-levels';

export interface Linear16 {
	data: Uint16Array;
	width: number;
	height: number;
	channels: 3;
}

/** The mean of each `factor` × `factor` block: exact in linear light (averaging encoded values would not be). Edge blocks average what they hold. */
export function shrinkLinear(image: Linear16, factor: number): Linear16 {
	if (factor <= 1) return image;
	const { data, width, height } = image;
	const outW = Math.ceil(width / factor);
	const outH = Math.ceil(height / factor);
	const sums = new Float64Array(outW * 3);
	const counts = new Uint32Array(outW);
	const out = new Uint16Array(outW * outH * 3);
	for (let oy = 0; oy < outH; oy++) {
		sums.fill(0);
		counts.fill(0);
		for (let y = oy * factor; y < Math.min(height, (oy + 1) * factor); y++) {
			let i = y * width * 3;
			for (let x = 0; x < width; x++, i += 3) {
				const o = Math.floor(x / factor);
				sums[o * 3] += data[i];
				sums[o * 3 + 1] += data[i + 1];
				sums[o * 3 + 2] += data[i + 2];
				counts[o]++;
			}
		}
		for (let ox = 0; ox < outW; ox++) {
			const base = (oy * outW + ox) * 3;
			out[base] = Math.round(sums[ox * 3] / counts[ox]);
			out[base + 1] = Math.round(sums[ox * 3 + 1] / counts[ox]);
			out[base + 2] = Math.round(sums[ox * 3 + 2] / counts[ox]);
		}
	}
	return { data: out, width: outW, height: outH, channels: 3 };
}

/** The largest power of two (up to 8) that keeps the longest side at least `least` pixels. */
export function blockFactorFor(width: number, height: number, least: number): number {
	const long = Math.max(width, height);
	return [8, 4, 2].find((f) => long / f >= least) ?? 1;
}

let CODES: Uint8Array | null = null;

/**
 * An 8-bit sRGB rendering (IEC 61966-2-1 transfer function) with mid-grey where a JPEG puts it (raw-levels.ts) and
 * everything above white clipped: no tone curve, so what is shown is what was measured.
 */
export function renderSrgb8(image: Linear16): Uint8Array {
	CODES ??= Uint8Array.from({ length: 65536 }, (_, v) => Math.round(255 * srgbEncode(Math.min(1, (v / 65535) * RAW_TO_SCENE_GAIN))));
	const out = new Uint8Array(image.data.length);
	for (let i = 0; i < out.length; i++) out[i] = CODES[image.data[i]];
	return out;
}
