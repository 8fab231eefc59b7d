// Measures an 8-bit sRGB image: luma histogram, clipping, and the subject's and background's linear light and colour.
import { relativeLuminance, srgbDecode } from '../../exposure/index';
import { measureColour } from './colour';
import { toPixelBounds, type Box } from './region';

export type LinearRgb = [number, number, number];

export interface RegionStats {
	/** Mean relative luminance Y (0–1) of the linear-light pixels. */
	luminance: number;
	/** That level in stops relative to 18 % grey (0 = mid-grey, −1 = half as bright). */
	stops: number;
	/** Mean linear-light sRGB, 0–1 per channel. */
	rgb: LinearRgb;
	/** Apparent colour temperature of the mean colour, K; null when too dark or too far from any white light. */
	cct: number | null;
	/** Distance of the mean colour from the Planckian locus (CIE 1960 uv); null when too dark. */
	duv: number | null;
	pixelCount: number;
}

export interface PixelMeasures {
	/** Counts per BT.709 luma code value 0–255 of the analysis image. */
	histogram: number[];
	/** Percent of pixels with a channel at the top code (blown). */
	clippedHighlights: number;
	/** Percent of pixels with every channel at the bottom code (blocked). */
	clippedShadows: number;
	subject: RegionStats;
	background: RegionStats;
}

export interface RgbImage {
	data: Uint8Array;
	width: number;
	height: number;
	channels: number;
}

// Scene-referred mid-grey: 18 % reflectance renders at a linear level of 0.18 in an sRGB JPEG
// (ISO 12232:2019 standard output sensitivity, CIPA DC-004).
export const MID_GREY = 0.18;

// The darkest level a non-zero 8-bit code can carry; a black region is floored here instead of −∞ stops.
const FLOOR_LUMINANCE = srgbDecode(1 / 255);
// A channel at 254–255 is blown; every channel at 0–1 is blocked. common practice, no published source
const HIGHLIGHT_CODE = 254;
const SHADOW_CODE = 1;

// 8-bit code to linear light, through the IEC 61966-2-1 transfer function of the exposure engine
const LINEAR = Float64Array.from({ length: 256 }, (_, code) => srgbDecode(code / 255));

// BT.709 weights, read back from the engine rather than copied (ITU-R BT.709-6, item 3.2)
const W_R = relativeLuminance([1, 0, 0]);
const W_G = relativeLuminance([0, 1, 0]);
const W_B = relativeLuminance([0, 0, 1]);

interface Accumulator {
	r: number;
	g: number;
	b: number;
	n: number;
}

export function stopsFromMidGrey(luminance: number): number {
	return Math.log2(Math.max(luminance, FLOOR_LUMINANCE) / MID_GREY);
}

function summarise(acc: Accumulator): RegionStats {
	const n = Math.max(acc.n, 1);
	const rgb: LinearRgb = [acc.r / n, acc.g / n, acc.b / n];
	// luminance is linear in R, G, B, so Y of the mean colour equals the mean of the pixels' Y
	const luminance = relativeLuminance(rgb);
	return { luminance, stops: stopsFromMidGrey(luminance), rgb, ...measureColour(rgb, luminance), pixelCount: acc.n };
}

/** One pass over the pixels; the subject box is in fractions of this image. */
export function measurePixels(image: RgbImage, subjectBox: Box): PixelMeasures {
	const { data, width, height, channels } = image;
	if (channels < 3) throw new RangeError('measurePixels needs RGB data');
	const { x0, y0, x1, y1 } = toPixelBounds(subjectBox, width, height);
	const histogram = new Array<number>(256).fill(0);
	const subject: Accumulator = { r: 0, g: 0, b: 0, n: 0 };
	const background: Accumulator = { r: 0, g: 0, b: 0, n: 0 };
	let blown = 0;
	let blocked = 0;

	for (let y = 0; y < height; y++) {
		const rowInBox = y >= y0 && y < y1;
		let i = y * width * channels;
		for (let x = 0; x < width; x++, i += channels) {
			const r = data[i];
			const g = data[i + 1];
			const b = data[i + 2];
			// BT.709 luma: the same weights applied to the encoded values, as camera histograms show
			histogram[Math.min(255, Math.round(W_R * r + W_G * g + W_B * b))]++;
			if (r >= HIGHLIGHT_CODE || g >= HIGHLIGHT_CODE || b >= HIGHLIGHT_CODE) blown++;
			else if (r <= SHADOW_CODE && g <= SHADOW_CODE && b <= SHADOW_CODE) blocked++;
			const acc = rowInBox && x >= x0 && x < x1 ? subject : background;
			acc.r += LINEAR[r];
			acc.g += LINEAR[g];
			acc.b += LINEAR[b];
			acc.n++;
		}
	}

	const total = width * height;
	return {
		histogram,
		clippedHighlights: (100 * blown) / total,
		clippedShadows: (100 * blocked) / total,
		subject: summarise(subject),
		background: summarise(background)
	};
}
