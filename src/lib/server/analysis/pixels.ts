// Measures an 8-bit sRGB image, or a raw file's linear 16-bit data, in linear light: histogram, clipping, a grid of cell levels, and robust subject and background levels.
import { relativeLuminance, srgbDecode, srgbEncode } from '../../exposure/index';
import { RAW_CLIP_SHARE, RAW_TO_SCENE_GAIN } from './raw-levels';
import { measureColour } from './colour';
import { cellPlaces, encodeGrid, gridSizeFor, type Cells, type LightGrid } from './light-grid';
import { toPixelBounds, type Box } from './region';

export type LinearRgb = [number, number, number];

export interface RegionStats {
	/** Relative luminance Y (0–1): 18 % grey × 2^stops. */
	luminance: number;
	/**
	 * Level in stops relative to 18 % grey (0 = mid-grey, −1 = half as bright): the 10 %-trimmed mean of the
	 * region's cell levels, each cell the log of the mean linear light of its usable pixels.
	 */
	stops: number;
	/** Mean linear-light sRGB of the usable pixels, 0–1 per channel. */
	rgb: LinearRgb;
	/** Apparent colour temperature of the mean colour, K; null when too dark or too far from any white light. */
	cct: number | null;
	/** Distance of the mean colour from the Planckian locus (CIE 1960 uv); null when too dark. */
	duv: number | null;
	pixelCount: number;
	/** Share (0–1) of the region's pixels with a channel at the top codes: left out of every level. */
	clippedShare: number;
	/** Share (0–1) of the region's pixels with every channel at the bottom codes: left out of every level. */
	crushedShare: number;
}

export interface PixelMeasures {
	/** Counts per BT.709 luma code value 0–255 of the analysis image. */
	histogram: number[];
	/** Percent of pixels with a channel at the top codes (blown). */
	clippedHighlights: number;
	/** Percent of pixels with every channel at the bottom codes (blocked). */
	clippedShadows: number;
	subject: RegionStats;
	background: RegionStats;
	/** Cell levels for comparing two frames of the same scene (grading's pair measures). */
	grid: LightGrid;
}

export interface RgbImage {
	/** 8-bit sRGB-encoded codes, or for `linear` images 16-bit linear values (0–65535 = black to the sensor's white). */
	data: Uint8Array | Uint16Array;
	width: number;
	height: number;
	channels: number;
	/** true for a raw file's linear data: no sRGB transfer function to undo (raw-levels.ts places its mid-grey). */
	linear?: boolean;
}

// Scene-referred mid-grey: 18 % reflectance renders at a linear level of 0.18 in an sRGB JPEG
// (ISO 12232:2019 standard output sensitivity, CIPA DC-004).
export const MID_GREY = 0.18;

// The darkest level a non-zero 8-bit code can carry; a black region is floored here instead of −∞ stops.
const FLOOR_LUMINANCE = srgbDecode(1 / 255);
/** A channel at or above this code is clipped: cameras clip per channel, often a few codes below 255. common practice, no published source */
export const CLIP_CODE = 250;
/** Every channel at or below this code is crushed to black: its level is noise. common practice, no published source */
export const CRUSH_CODE = 2;
// a cell with fewer usable pixels than this share says little about its light
const MIN_USABLE_SHARE = 0.5;
const TRIM = 0.1;

// 8-bit code to linear light, through the IEC 61966-2-1 transfer function of the exposure engine
const LINEAR = Float64Array.from({ length: 256 }, (_, code) => srgbDecode(code / 255));

// BT.709 weights, read back from the engine rather than copied (ITU-R BT.709-6, item 3.2)
const W_R = relativeLuminance([1, 0, 0]);
const W_G = relativeLuminance([0, 1, 0]);
const W_B = relativeLuminance([0, 0, 1]);

export function stopsFromMidGrey(luminance: number): number {
	return Math.log2(Math.max(luminance, FLOOR_LUMINANCE) / MID_GREY);
}

/** Mean of the middle 80 % of the values (a 10 %-trimmed mean); NaN for none. */
export function trimmedMean(values: number[]): number {
	if (values.length === 0) return NaN;
	const sorted = [...values].sort((a, b) => a - b);
	const cut = Math.floor(sorted.length * TRIM);
	const kept = sorted.slice(cut, sorted.length - cut);
	return kept.reduce((s, v) => s + v, 0) / kept.length;
}

interface Sums {
	r: Float64Array;
	g: Float64Array;
	b: Float64Array;
	usable: Uint32Array;
	clipped: Uint32Array;
	crushed: Uint32Array;
	total: Uint32Array;
}

function sums(n: number): Sums {
	return { r: new Float64Array(n), g: new Float64Array(n), b: new Float64Array(n), usable: new Uint32Array(n), clipped: new Uint32Array(n), crushed: new Uint32Array(n), total: new Uint32Array(n) };
}

// Region accumulators: 0 background, 1 subject (exact box in pixels)
function regionStats(acc: Sums, k: number, cellLevels: number[]): RegionStats {
	const usable = acc.usable[k];
	const total = Math.max(acc.total[k], 1);
	const rgb: LinearRgb = usable ? [acc.r[k] / usable, acc.g[k] / usable, acc.b[k] / usable] : [0, 0, 0];
	const robust = trimmedMean(cellLevels);
	const stops = Number.isFinite(robust) ? robust : stopsFromMidGrey(relativeLuminance(rgb));
	const luminance = MID_GREY * 2 ** stops;
	return {
		luminance,
		stops,
		rgb,
		...measureColour(rgb, relativeLuminance(rgb)),
		pixelCount: acc.total[k],
		clippedShare: acc.clipped[k] / total,
		crushedShare: acc.crushed[k] / total
	};
}

// 8-bit code to its share of BT.709 luma, in 1/65536, so the histogram's luma code is one integer sum and a shift
const LUMA_R = Int32Array.from({ length: 256 }, (_, v) => Math.round(W_R * v * 65536));
const LUMA_G = Int32Array.from({ length: 256 }, (_, v) => Math.round(W_G * v * 65536));
const LUMA_B = Int32Array.from({ length: 256 }, (_, v) => Math.round(W_B * v * 65536));

// Linear 16-bit value to the analysis's linear scale (mid-grey 0.18), to its 8-bit sRGB code for the histogram, and the
// clip and crush thresholds: a raw file's levels on the same footing as a JPEG's
const CLIP_16 = Math.round(RAW_CLIP_SHARE * 65535);
// every channel at or below the level an 8-bit sRGB file calls crushed
const CRUSH_16 = Math.floor((srgbDecode(CRUSH_CODE / 255) / RAW_TO_SCENE_GAIN) * 65535);

/** How a sample value reads: its linear light, its 8-bit sRGB code (for the histogram), where clipping and crushing start. */
interface SampleScale {
	linear: Float64Array;
	code: ArrayLike<number>;
	clip: number;
	crush: number;
}

const JPEG_SCALE: SampleScale = { linear: LINEAR, code: Uint8Array.from({ length: 256 }, (_, v) => v), clip: CLIP_CODE, crush: CRUSH_CODE };

let RAW_SCALE: SampleScale | null = null;

/** A raw file's linear 16-bit samples, tabulated on first use (a JPEG-only server never builds them). */
function rawScale(): SampleScale {
	if (!RAW_SCALE) {
		const linear = Float64Array.from({ length: 65536 }, (_, v) => (v / 65535) * RAW_TO_SCENE_GAIN);
		const code = Uint8Array.from(linear, (v) => Math.round(255 * srgbEncode(Math.min(1, v))));
		RAW_SCALE = { linear, code, clip: CLIP_16, crush: CRUSH_16 };
	}
	return RAW_SCALE;
}

/** Runs of a row that lie in one cell and one region: [start x, end x, cell column, region] flattened. */
function spansFor(width: number, cols: number, box: { x0: number; x1: number } | null): Int32Array {
	const cuts = new Set<number>([0, width]);
	for (let c = 1; c < cols; c++) cuts.add(Math.ceil((c * width) / cols));
	if (box) {
		cuts.add(box.x0);
		cuts.add(box.x1);
	}
	const sorted = [...cuts].filter((x) => x >= 0 && x <= width).sort((a, b) => a - b);
	const out: number[] = [];
	for (let i = 0; i + 1 < sorted.length; i++) {
		const a = sorted[i];
		const b = sorted[i + 1];
		if (b <= a) continue;
		const inBox = box !== null && a >= box.x0 && a < box.x1 ? 1 : 0;
		out.push(a, b, Math.floor((a * cols) / width), inBox);
	}
	return Int32Array.from(out);
}

/** A pass over the pixels in progress: the accumulators and what the loop needs. */
interface Pass {
	image: RgbImage;
	subjectBox: Box;
	bounds: { x0: number; y0: number; x1: number; y1: number };
	cols: number;
	rows: number;
	/** row runs outside the box's rows, and across them */
	outside: Int32Array;
	across: Int32Array;
	histogram: Float64Array;
	cells: Sums;
	regions: Sums;
}

function startPass(image: RgbImage, subjectBox: Box): Pass {
	const { width, height, channels } = image;
	if (channels < 3) throw new RangeError('measurePixels needs RGB data');
	const { cols, rows } = gridSizeFor(width, height);
	const bounds = toPixelBounds(subjectBox, width, height);
	return {
		image,
		subjectBox,
		bounds,
		cols,
		rows,
		outside: spansFor(width, cols, null),
		across: spansFor(width, cols, bounds),
		histogram: new Float64Array(256),
		cells: sums(cols * rows),
		regions: sums(2)
	};
}

/**
 * Rows yFrom (inclusive) to yTo (exclusive) of the pass. Each row is walked in runs that stay in one cell and one
 * region, summed in locals: the hot loop of grading, about twice as fast as adding every pixel to the arrays.
 */
function addRows(pass: Pass, yFrom: number, yTo: number): void {
	const { data, width, height, channels } = pass.image;
	const { linear, code, clip, crush } = pass.image.linear ? rawScale() : JPEG_SCALE;
	const { y0, y1 } = pass.bounds;
	const { cols, rows, histogram, cells, regions } = pass;
	for (let y = yFrom; y < yTo; y++) {
		const spans = y >= y0 && y < y1 ? pass.across : pass.outside;
		const rowBase = Math.floor((y * rows) / height) * cols;
		const rowStart = y * width * channels;
		for (let s = 0; s < spans.length; s += 4) {
			const c = rowBase + spans[s + 2];
			const k = spans[s + 3];
			let sr = 0;
			let sg = 0;
			let sb = 0;
			let usable = 0;
			let clipped = 0;
			let crushed = 0;
			const end = rowStart + spans[s + 1] * channels;
			for (let i = rowStart + spans[s] * channels; i < end; i += channels) {
				const r = data[i];
				const g = data[i + 1];
				const b = data[i + 2];
				// BT.709 luma: the same weights applied to the encoded values, as camera histograms show (a raw file's
				// levels as an sRGB rendering of them would show)
				histogram[(LUMA_R[code[r]] + LUMA_G[code[g]] + LUMA_B[code[b]] + 32768) >> 16]++;
				if (r >= clip || g >= clip || b >= clip) clipped++;
				else if (r <= crush && g <= crush && b <= crush) crushed++;
				else {
					sr += linear[r];
					sg += linear[g];
					sb += linear[b];
					usable++;
				}
			}
			const count = spans[s + 1] - spans[s];
			cells.total[c] += count;
			cells.clipped[c] += clipped;
			cells.crushed[c] += crushed;
			cells.usable[c] += usable;
			cells.r[c] += sr;
			cells.g[c] += sg;
			cells.b[c] += sb;
			regions.total[k] += count;
			regions.clipped[k] += clipped;
			regions.crushed[k] += crushed;
			regions.usable[k] += usable;
			regions.r[k] += sr;
			regions.g[k] += sg;
			regions.b[k] += sb;
		}
	}
}

/** One pass over the pixels: each is linearised before anything is averaged. The box is in fractions of this image. */
export function measurePixels(image: RgbImage, subjectBox: Box): PixelMeasures {
	const pass = startPass(image, subjectBox);
	addRows(pass, 0, image.height);
	return finishPass(pass);
}

/** Pixels per slice of measurePixelsInSlices: a few milliseconds of work on this kind of machine. */
export const SLICE_PIXELS = 65_536;

/**
 * measurePixels, a slice of rows at a time with `pause` between slices, so a server that grades in its own process
 * keeps answering requests while a large frame is measured (one pass over 1.5 MP is a few hundred milliseconds).
 */
export async function measurePixelsInSlices(
	image: RgbImage,
	subjectBox: Box,
	pause: () => Promise<void> = () => new Promise((resolve) => setImmediate(resolve))
): Promise<PixelMeasures> {
	const pass = startPass(image, subjectBox);
	const rowsPerSlice = Math.max(1, Math.floor(SLICE_PIXELS / Math.max(image.width, 1)));
	for (let y = 0; y < image.height; y += rowsPerSlice) {
		addRows(pass, y, Math.min(image.height, y + rowsPerSlice));
		if (y + rowsPerSlice < image.height) await pause();
	}
	return finishPass(pass);
}

function finishPass(pass: Pass): PixelMeasures {
	const { image, subjectBox, cols, rows, histogram, cells, regions } = pass;
	const { width, height } = image;
	const n = cols * rows;
	const grid: Cells = { cols, rows, r: new Float32Array(n), g: new Float32Array(n), b: new Float32Array(n), clipped: new Float32Array(n), crushed: new Float32Array(n) };
	const places = cellPlaces(cols, rows, subjectBox);
	const levels: [number[], number[]] = [[], []];
	let blown = 0;
	let blocked = 0;
	for (let c = 0; c < n; c++) {
		const u = cells.usable[c];
		const total = Math.max(cells.total[c], 1);
		grid.r[c] = u ? cells.r[c] / u : NaN;
		grid.g[c] = u ? cells.g[c] / u : NaN;
		grid.b[c] = u ? cells.b[c] / u : NaN;
		grid.clipped[c] = cells.clipped[c] / total;
		grid.crushed[c] = cells.crushed[c] / total;
		blown += cells.clipped[c];
		blocked += cells.crushed[c];
		if (u / total < MIN_USABLE_SHARE || places[c] === 'edge') continue;
		const y = W_R * grid.r[c] + W_G * grid.g[c] + W_B * grid.b[c];
		levels[places[c] === 'subject' ? 1 : 0].push(stopsFromMidGrey(y));
	}

	const total = width * height;
	return {
		histogram: Array.from(histogram),
		clippedHighlights: (100 * blown) / total,
		clippedShadows: (100 * blocked) / total,
		subject: regionStats(regions, 1, levels[1]),
		background: regionStats(regions, 0, levels[0]),
		grid: encodeGrid(grid)
	};
}
