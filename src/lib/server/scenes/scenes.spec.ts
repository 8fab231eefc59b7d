import { convertLrgbToRgb } from 'culori';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { ev100 } from '../../exposure/apex';
import { srgbDecode } from '../../exposure/srgb';
import { renderedSwatch } from '../../exposure/swatch';
import { encodeSrgb, toWebp, type Picture } from './encode';
import { litFrames, renderedFigures } from './figures';
import { ambientScale, flashScale, lightRgb, whiteBalanceMatrix } from './light';
import { renderScene } from './render';

const figure = (name: string) => renderedFigures.find((f) => f.name === name)!;

/** Mean linear light of a rectangle (fractions of the frame) of 8-bit sRGB pixels, decoded per IEC 61966-2-1; also whether any channel clipped. */
function linearMean(p: { width: number; height: number; data: Uint8Array | Buffer }, box: [number, number, number, number], channels = 3) {
	const [x0, y0, x1, y1] = [box[0] * p.width, box[1] * p.height, box[2] * p.width, box[3] * p.height].map(Math.round);
	let sum = 0;
	let n = 0;
	let clipped = false;
	for (let y = y0; y < y1; y++) {
		for (let x = x0; x < x1; x++) {
			for (let c = 0; c < 3; c++) {
				const v = p.data[(y * p.width + x) * channels + c];
				if (v === 255) clipped = true;
				sum += srgbDecode(v / 255);
				n++;
			}
		}
	}
	return { mean: sum / n, clipped };
}

const small = { width: 96, height: 72, supersample: 1 };
const SKY: [number, number, number, number] = [0, 0, 1, 0.2];

describe('scene exposure comes from the engine', () => {
	it('records the metered daylight at the meter and a quarter of it two stops under', () => {
		// APEX (ASA PH2.5-1960 / CIPA DC-008 Annex C): +2 EV is a quarter of the exposure
		const meter = { aperture: 11, shutter: 1 / 250, iso: 100, wbK: 5500 };
		expect(ambientScale(ev100(meter), meter)).toBeCloseTo(1, 12);
		expect(ambientScale(ev100(meter), { ...meter, aperture: 22 })).toBeCloseTo(0.25, 12);
		expect(ambientScale(ev100(meter), { ...meter, shutter: 1 / 1000 })).toBeCloseTo(0.25, 12);
		expect(ambientScale(ev100(meter), { ...meter, iso: 400 })).toBeCloseTo(4, 12);
	});

	it('lights a surface square to the flash correctly at GN ÷ f-number, and a quarter as much twice as far', () => {
		// ISO 1230:1992: guide number = distance × f-number for correct exposure; inverse-square law
		const camera = { aperture: 8, shutter: 1 / 250, iso: 100, wbK: 5500 };
		const flash = { at: [0, 0, 0] as const, gn: 40 };
		expect(flashScale({ ...flash, at: [0, 0, 0] }, camera, 5)).toBeCloseTo(1, 12);
		expect(flashScale({ ...flash, at: [0, 0, 0] }, camera, 10)).toBeCloseTo(0.25, 12);
		expect(flashScale({ ...flash, at: [0, 0, 0], power: 0.5 }, camera, 5)).toBeCloseTo(0.5, 12);
		// above sync the high-speed-sync cost comes off: 1/1000 s is 2 stops past 1/250 s, plus 1 stop to enter HSS
		// (common practice, no published source; the engine's hssCost default)
		expect(flashScale({ ...flash, at: [0, 0, 0] }, { ...camera, shutter: 1 / 1000 }, 5)).toBeCloseTo(2 ** -3, 12);
	});

	it('white-balances light exactly as the Gel Mixer swatches do', () => {
		// one path for pictures and swatches: Planckian white (Kang et al. 2002) adapted by Bradford to D65
		for (const [lightK, wbK] of [[5500, 5500], [2934, 3200], [5500, 3200], [6500, 5000]]) {
			const wb = whiteBalanceMatrix(wbK);
			const light = lightRgb(lightK).map((v) => v * 0.18);
			const rgb = wb.map((row) => row[0] * light[0] + row[1] * light[1] + row[2] * light[2]);
			const picture = encodeSrgb({ width: 1, height: 1, data: Float32Array.from(rgb) });
			const hex = '#' + [...picture.data].map((v) => v.toString(16).padStart(2, '0')).join('');
			// the swatch maps out-of-gamut colours in; these four are inside sRGB, so the two agree to one code value
			const swatch = renderedSwatch({ lightK, cameraWbK: wbK, reflectance: 0.18 });
			for (let c = 0; c < 3; c++) {
				expect(Math.abs(parseInt(hex.slice(1 + 2 * c, 3 + 2 * c), 16) - parseInt(swatch.slice(1 + 2 * c, 3 + 2 * c), 16))).toBeLessThanOrEqual(1);
			}
		}
	});

	it('encodes linear light with the IEC 61966-2-1 curve, as culori does', () => {
		// culori 4 (lrgb → rgb, the CSS Color 4 sRGB curve from IEC 61966-2-1) as an independent reference
		const values = Array.from({ length: 301 }, (_, i) => i / 300);
		const picture = encodeSrgb({ width: values.length, height: 1, data: Float32Array.from(values.flatMap((v) => [v, v, v])) });
		values.forEach((v, i) => {
			const ref = convertLrgbToRgb({ r: v, g: v, b: v });
			expect(picture.data[i * 3]).toBe(Math.round(ref.r * 255));
		});
		// light beyond the sensor's full well clips to white, negative (out-of-gamut) light to black
		const clip = encodeSrgb({ width: 2, height: 1, data: Float32Array.from([1.7, 2, 9, -0.2, -1, 0]) });
		expect([...clip.data]).toEqual([255, 255, 255, 0, 0, 0]);
	});
});

describe('rendered frames', () => {
	const [atMeter, under, relit] = figure('dim-and-relight').panels;
	const render = (p: typeof atMeter) => encodeSrgb(renderScene(p.scene, p.camera, p.flashes, small));

	it('darkens the background two stops: a quarter of the linear light, measured from the pixels', () => {
		const a = linearMean(render(atMeter), SKY);
		const b = linearMean(render(under), SKY);
		expect(a.clipped).toBe(false);
		expect(b.mean / a.mean).toBeGreaterThan(0.25 - 0.01);
		expect(b.mean / a.mean).toBeLessThan(0.25 + 0.01);
	});

	it('keeps the relation after WebP encoding, within the codec’s error', async () => {
		const encode = async (p: typeof atMeter) => {
			const webp = await toWebp(render(p));
			return sharp(webp).removeAlpha().raw().toBuffer({ resolveWithObject: true });
		};
		const a = await encode(atMeter);
		const b = await encode(under);
		const ratio = linearMean({ ...a.info, data: b.data }, SKY).mean / linearMean({ ...a.info, data: a.data }, SKY).mean;
		expect(ratio).toBeGreaterThan(0.25 - 0.02);
		expect(ratio).toBeLessThan(0.25 + 0.02);
	});

	it('relights the athlete by flash while the sky stays two stops down', () => {
		// where the runner's shirt is in the small frame: the box around the torso
		const torso: [number, number, number, number] = [0.55, 0.4, 0.6, 0.5];
		const dark = render(under);
		const lit = render(relit);
		expect(linearMean(lit, SKY).mean).toBeCloseTo(linearMean(dark, SKY).mean, 6);
		expect(Math.log2(linearMean(lit, torso).mean / linearMean(dark, torso).mean)).toBeGreaterThan(2);
	});

	it('measures the flash alone falling off with distance on the ground', () => {
		const p = relit;
		const flashOnly = renderScene(p.scene, p.camera, p.flashes, { ...small, only: 'flash' });
		const daylightOnly = renderScene(p.scene, p.camera, p.flashes, { ...small, only: 'ambient' });
		const both = renderScene(p.scene, p.camera, p.flashes, small);
		// light adds: daylight plus flash is the frame with both, pixel by pixel, in linear light
		for (let i = 0; i < both.data.length; i += 97) expect(both.data[i]).toBeCloseTo(flashOnly.data[i] + daylightOnly.data[i], 5);
		// no flash reaches the sky
		expect(linearMean(encodeSrgb(flashOnly), SKY).mean).toBe(0);
	});

	it('renders the same bytes every time', async () => {
		const one = render(relit);
		const two = render(relit);
		expect(Buffer.from(one.data).equals(Buffer.from(two.data))).toBe(true);
		const w1 = await toWebp(one as Picture);
		const w2 = await toWebp(two as Picture);
		expect(w1.equals(w2)).toBe(true);
	});
});

describe('a burst against the flash’s recycle time', () => {
	it('lights every third frame at 10 frames a second when the flash needs 0.25 s', () => {
		// lesson 18's worked example (common practice, no published source: recycle time proportional to power):
		// 2 s at full power, 1/8 power → 0.25 s; frames every 0.1 s → frames 1, 4, 7 and 10 of ten
		const lit = litFrames({ frames: 10, fps: 10, recycle: 2 / 8 });
		expect(lit.flatMap((on, i) => (on ? [i + 1] : []))).toEqual([1, 4, 7, 10]);
		// full power (2 s) lights only the first frame of the burst
		expect(litFrames({ frames: 10, fps: 10, recycle: 2 }).filter(Boolean)).toHaveLength(1);
		// a recycle of exactly two frame intervals lights every other frame
		expect(litFrames({ frames: 6, fps: 10, recycle: 0.2 })).toEqual([true, false, true, false, true, false]);
	});
});
