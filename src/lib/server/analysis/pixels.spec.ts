import { describe, expect, it } from 'vitest';
import { wcagLuminance } from 'culori';
import { measurePixels, measurePixelsInSlices, MID_GREY, SLICE_PIXELS, stopsFromMidGrey, type RgbImage } from './pixels';
import { toPixelBounds, type Box } from './region';

type Rgb8 = [number, number, number];

function image(width: number, height: number, paint: (x: number, y: number) => Rgb8): RgbImage {
	const data = new Uint8Array(width * height * 3);
	for (let y = 0; y < height; y++) {
		for (let x = 0; x < width; x++) data.set(paint(x, y), (y * width + x) * 3);
	}
	return { data, width, height, channels: 3 };
}

const uniform = (c: Rgb8, w = 40, h = 30) => image(w, h, () => c);
// culori (npm reference library): sRGB decode per IEC 61966-2-1, then BT.709 weights
const culoriY = ([r, g, b]: Rgb8) => wcagLuminance({ mode: 'rgb', r: r / 255, g: g / 255, b: b / 255 });
const BOX: Box = { x: 0.25, y: 0.25, w: 0.5, h: 0.5 };

describe('measurePixels', () => {
	it('sums every pixel into its own cell and region, for boxes and grids that do not line up (checked pixel by pixel)', () => {
		// a random picture with clipped and crushed pixels; the expected means are summed naively, one pixel at a time,
		// with culori's decode (IEC 61966-2-1), so a pixel counted twice, skipped or put in the wrong region shows
		let seed = 7;
		const next = () => ((seed = (seed * 1103515245 + 12345) >>> 0) >>> 8) % 256;
		const img = image(97, 61, () => [next(), next(), next()]);
		const box: Box = { x: 0.213, y: 0.301, w: 0.377, h: 0.419 };
		const m = measurePixels(img, box);
		const { x0, y0, x1, y1 } = toPixelBounds(box, 97, 61);
		const sums = [
			[0, 0, 0, 0, 0],
			[0, 0, 0, 0, 0]
		];
		for (let y = 0; y < 61; y++) {
			for (let x = 0; x < 97; x++) {
				const [r, g, b] = img.data.subarray((y * 97 + x) * 3, (y * 97 + x) * 3 + 3);
				const k = x >= x0 && x < x1 && y >= y0 && y < y1 ? 1 : 0;
				if (r >= 250 || g >= 250 || b >= 250) sums[k][4]++;
				else if (r > 2 || g > 2 || b > 2) {
					const lin = wcagLuminance({ mode: 'rgb', r: r / 255, g: 0, b: 0 });
					sums[k][0] += lin / 0.2126;
					sums[k][1] += wcagLuminance({ mode: 'rgb', r: 0, g: g / 255, b: 0 }) / 0.7152;
					sums[k][2] += wcagLuminance({ mode: 'rgb', r: 0, g: 0, b: b / 255 }) / 0.0722;
					sums[k][3]++;
				}
			}
		}
		for (const [k, region] of [[1, m.subject], [0, m.background]] as const) {
			const [r, g, b, n, clipped] = sums[k];
			expect(region.rgb[0]).toBeCloseTo(r / n, 4);
			expect(region.rgb[1]).toBeCloseTo(g / n, 4);
			expect(region.rgb[2]).toBeCloseTo(b / n, 4);
			expect(region.clippedShare).toBeCloseTo(clipped / region.pixelCount, 6);
		}
		expect(m.subject.pixelCount).toBe((x1 - x0) * (y1 - y0));
		expect(m.subject.pixelCount + m.background.pixelCount).toBe(97 * 61);
		expect(m.histogram.reduce((a, v) => a + v, 0)).toBe(97 * 61);
	});

	it('measures linear-light luminance as the culori reference does', () => {
		for (const c of [[118, 118, 118], [200, 120, 40], [10, 60, 230], [3, 3, 3]] as Rgb8[]) {
			const m = measurePixels(uniform(c), BOX);
			expect(m.subject.luminance, c.join()).toBeCloseTo(culoriY(c), 7);
			expect(m.background.luminance, c.join()).toBeCloseTo(culoriY(c), 7);
		}
	});

	it('weights the channels per ITU-R BT.709-6 (0.2126, 0.7152, 0.0722)', () => {
		// ITU-R BT.709-6 item 3.2 luminance equation; code 240 decodes to 0.8714 (IEC 61966-2-1: ((240/255 + 0.055)/1.055)^2.4)
		const full = 0.8714;
		expect(measurePixels(uniform([240, 0, 0]), BOX).subject.luminance).toBeCloseTo(0.2126 * full, 4);
		expect(measurePixels(uniform([0, 240, 0]), BOX).subject.luminance).toBeCloseTo(0.7152 * full, 4);
		expect(measurePixels(uniform([0, 0, 240]), BOX).subject.luminance).toBeCloseTo(0.0722 * full, 4);
	});

	it('puts 8-bit code 118 at mid-grey, about 0 stops', () => {
		// IEC 61966-2-1: ((118/255 + 0.055)/1.055)^2.4 = 0.1812; ISO 12232:2019 SOS puts 18 % grey at code 118
		const m = measurePixels(uniform([118, 118, 118]), BOX);
		expect(m.subject.luminance).toBeCloseTo(0.1812, 4);
		expect(Math.abs(m.subject.stops)).toBeLessThan(0.02);
	});

	it('averages light, not code values: fine texture of codes 40 and 220 is their mean linear light', () => {
		// IEC 61966-2-1: code 40 → 0.02122, code 220 → 0.71569; their mean 0.36846 (hand-worked); the mean code 130
		// would decode to only 0.2232, 0.72 stop darker
		// texture finer than a grid cell (400 px wide: 40 cells of 10 px) is averaged in linear light within the cell
		const m = measurePixels(image(400, 300, (x) => (x % 2 ? [220, 220, 220] : [40, 40, 40])), BOX);
		expect(m.background.luminance).toBeCloseTo(0.36846, 4);
		expect(m.background.stops).toBeCloseTo(Math.log2(0.36846 / MID_GREY), 3);
	});

	it('leaves clipped and crushed pixels out of a level and counts them per region', () => {
		// a background of mid-grey (code 118) with every fourth pixel blown white and every fourth black
		const m = measurePixels(image(400, 320, (x) => (x % 4 === 0 ? [255, 255, 255] : x % 4 === 1 ? [0, 0, 0] : [118, 118, 118])), BOX);
		// IEC 61966-2-1: code 118 → 0.1812
		expect(m.background.luminance).toBeCloseTo(0.1812, 3);
		expect(m.background.clippedShare).toBeCloseTo(0.25, 2);
		expect(m.background.crushedShare).toBeCloseTo(0.25, 2);
		// the guard: a channel at code 250 or above is clipped, even when the others are not
		const red = measurePixels(uniform([252, 90, 40]), BOX);
		expect(red.subject.clippedShare).toBe(1);
		expect(measurePixels(uniform([249, 90, 40]), BOX).subject.clippedShare).toBe(0);
	});

	it('splits the subject box from the rest of the frame', () => {
		const width = 60;
		const height = 40;
		const { x0, y0, x1, y1 } = toPixelBounds(BOX, width, height);
		const inside = (x: number, y: number) => x >= x0 && x < x1 && y >= y0 && y < y1;
		const m = measurePixels(image(width, height, (x, y) => (inside(x, y) ? [200, 200, 200] : [50, 50, 50])), BOX);
		expect(m.subject.pixelCount).toBe((x1 - x0) * (y1 - y0));
		expect(m.background.pixelCount).toBe(width * height - (x1 - x0) * (y1 - y0));
		expect(m.subject.luminance).toBeCloseTo(culoriY([200, 200, 200]), 7);
		expect(m.background.luminance).toBeCloseTo(culoriY([50, 50, 50]), 7);
		expect(m.subject.stops - m.background.stops).toBeCloseTo(Math.log2(culoriY([200, 200, 200]) / culoriY([50, 50, 50])), 6);
	});

	it('counts a luma histogram over every pixel', () => {
		const grey = measurePixels(uniform([118, 118, 118], 20, 10), BOX);
		expect(grey.histogram.reduce((a, b) => a + b, 0)).toBe(200);
		expect(grey.histogram[118]).toBe(200);
		// BT.709 luma of pure red: 0.2126 × 255 = 54.2
		expect(measurePixels(uniform([255, 0, 0], 20, 10), BOX).histogram[54]).toBe(200);
		expect(measurePixels(uniform([255, 255, 255], 20, 10), BOX).histogram[255]).toBe(200);
	});

	it('reports blown highlights (any channel at the top) and blocked shadows (all channels at the bottom) in percent', () => {
		// columns 0–9 white, 10–14 pure red, 15–19 black, the rest mid-grey, in a 40-wide frame
		const m = measurePixels(
			image(40, 10, (x) => (x < 10 ? [255, 255, 255] : x < 15 ? [255, 0, 0] : x < 20 ? [0, 0, 0] : [118, 118, 118])),
			BOX
		);
		expect(m.clippedHighlights).toBeCloseTo(37.5, 10);
		expect(m.clippedShadows).toBeCloseTo(12.5, 10);
	});

	it('gives a neutral region the colour temperature of D65, about 6504 K', () => {
		// CIE 015:2004: D65 has a correlated colour temperature of about 6504 K; sRGB white is D65 (IEC 61966-2-1)
		const m = measurePixels(uniform([180, 180, 180]), BOX);
		expect(m.subject.cct).toBeGreaterThan(6480);
		expect(m.subject.cct).toBeLessThan(6530);
	});

	it('gives no colour temperature for a region too dark to have a colour', () => {
		const m = measurePixels(uniform([4, 2, 9]), BOX);
		expect(m.subject.cct).toBeNull();
		expect(Number.isFinite(m.subject.stops)).toBe(true);
	});
});

describe('stopsFromMidGrey', () => {
	it('counts stops from 18 % grey and floors black at the darkest 8-bit level', () => {
		expect(stopsFromMidGrey(0.36)).toBeCloseTo(1, 12);
		expect(stopsFromMidGrey(0.045)).toBeCloseTo(-2, 12);
		expect(stopsFromMidGrey(0)).toBe(stopsFromMidGrey(1e-9));
		expect(stopsFromMidGrey(0)).toBeGreaterThan(-10);
	});
});

describe('measurePixelsInSlices', () => {
	it('measures exactly what the single pass does, pausing between slices of rows', async () => {
		// a frame of several slices, with a lit subject, clipped and crushed pixels and a gradient
		const width = 700;
		const height = 400;
		const frame = image(width, height, (x, y) => {
			if (x % 97 === 0) return [255, 255, 255];
			if (y % 89 === 0) return [0, 0, 0];
			const lit = x > width * 0.3 && x < width * 0.7 && y > height * 0.2 && y < height * 0.8;
			return lit ? [190, 170 + (x % 20), 150] : [40 + (y % 50), 60, 90 + (x % 30)];
		});
		let pauses = 0;
		const sliced = await measurePixelsInSlices(frame, BOX, async () => {
			pauses++;
		});
		expect(sliced).toEqual(measurePixels(frame, BOX));
		const rowsPerSlice = Math.floor(SLICE_PIXELS / width);
		expect(pauses).toBe(Math.ceil(height / rowsPerSlice) - 1);
		expect(pauses).toBeGreaterThan(1);
	});
});
