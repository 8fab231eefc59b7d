// Renders an ambient reference and a flash-lit frame of one invented scene through the camera pipeline, and the truth.
import sharp from 'sharp';
import { buildExif, REFERENCE_EXIF } from '../analysis/test-frames';
import { CLIP_CODE, type Box } from '../analysis/index';
import { miredOf } from '../grading/pair/index';
import { codeLut, lightColour, whiteBalanceGains, type Rgb, type ToneCurve } from './camera';

export interface SceneCase {
	id: string;
	seed: number;
	curve: ToneCurve;
	quality: number;
	/** Exif settings difference, stops (lit darker). */
	d: number;
	/** How much darker the lit frame's ambient really is than the Exif says (an edited frame), stops. */
	edit: number;
	/** Wanted median flash lift on the subject, stops (0 = no flash). */
	lift: number;
	subjectTone: 'light' | 'mid' | 'dark';
	/** Sky level over mid-grey in the reference, stops (above about 2.5 it clips). */
	skyStops: number;
	/** Subject box this many times the subject's own bounds (1 = tight). */
	looseness: number;
	/** Full CTO on the flash (+159 mired). */
	gel: boolean;
	/** White balance of the lit and the reference frame, K. */
	wbLit: number;
	wbRef: number;
	/** Exif Flash bit set in the lit frame. */
	fired: boolean;
}

export interface SceneTruth {
	/** Median over the subject's pixels of log2((ambient + flash) / ambient), stops. */
	lift: number;
	/** True darkening of the ambient from reference to lit, stops. */
	drop: number;
	/** Mireds warmer the light on the subject is than the ambient (neutral surface). */
	warmerMired: number | null;
	/** Share of the subject's pixels clipped in the lit frame and not in the reference. */
	blownShare: number;
	/** Share of the reference background clipped. */
	referenceClipped: number;
}

export interface RenderedPair {
	reference: Buffer;
	lit: Buffer;
	box: Box;
	truth: SceneTruth;
}

export const WIDTH = 768;
export const HEIGHT = 512;
const DAYLIGHT_K = 5500;
// Full CTO: +159 mired on a 5500 K flash. common practice, no published source (swatch-book value, from memory)
const CTO_MIRED = 159;

/** mulberry32: a small seeded generator, so every case renders the same each run. */
export function random(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

/** Value noise: a random lattice every `cell` pixels, bilinear between, −1…1. */
function noiseField(rand: () => number, width: number, height: number, cell: number): Float32Array {
	const gw = Math.ceil(width / cell) + 2;
	const gh = Math.ceil(height / cell) + 2;
	const grid = Float32Array.from({ length: gw * gh }, () => rand() * 2 - 1);
	const out = new Float32Array(width * height);
	for (let y = 0; y < height; y++) {
		const gy = y / cell;
		const y0 = Math.floor(gy);
		const fy = gy - y0;
		for (let x = 0; x < width; x++) {
			const gx = x / cell;
			const x0 = Math.floor(gx);
			const fx = gx - x0;
			const a = grid[y0 * gw + x0];
			const b = grid[y0 * gw + x0 + 1];
			const c = grid[(y0 + 1) * gw + x0];
			const d = grid[(y0 + 1) * gw + x0 + 1];
			out[y * width + x] = (a * (1 - fx) + b * fx) * (1 - fy) + (c * (1 - fx) + d * fx) * fy;
		}
	}
	return out;
}

/** An athlete-like blob: torso, head and two limbs as ellipses, somewhere in the middle of the frame. */
function subjectMask(rand: () => number, width: number, height: number): { mask: Uint8Array; bounds: { x0: number; y0: number; x1: number; y1: number } } {
	const cx = width * (0.35 + 0.3 * rand());
	const cy = height * (0.5 + 0.1 * rand());
	const s = height * (0.16 + 0.06 * rand());
	const parts = [
		{ x: cx, y: cy, rx: s * 0.55, ry: s },
		{ x: cx + s * 0.1 * (rand() - 0.5), y: cy - s * 1.3, rx: s * 0.32, ry: s * 0.38 },
		{ x: cx + s * (0.5 + 0.4 * rand()), y: cy - s * 0.3, rx: s * 0.18, ry: s * 0.6 },
		{ x: cx - s * 0.25, y: cy + s * 1.2, rx: s * 0.22, ry: s * 0.7 }
	];
	const mask = new Uint8Array(width * height);
	let x0 = width;
	let y0 = height;
	let x1 = 0;
	let y1 = 0;
	for (let y = 0; y < height; y++) {
		for (let x = 0; x < width; x++) {
			let inside = false;
			for (const p of parts) {
				const dx = (x - p.x) / p.rx;
				const dy = (y - p.y) / p.ry;
				if (dx * dx + dy * dy <= 1) {
					inside = true;
					break;
				}
			}
			if (inside) {
				mask[y * width + x] = 1;
				x0 = Math.min(x0, x);
				y0 = Math.min(y0, y);
				x1 = Math.max(x1, x + 1);
				y1 = Math.max(y1, y + 1);
			}
		}
	}
	return { mask, bounds: { x0, y0, x1, y1 } };
}

const TONES: Record<SceneCase['subjectTone'], Rgb> = {
	// invented reflectances: a light jersey, mid-toned skin, dark kit (linear, 0–1)
	light: [0.62, 0.58, 0.52],
	mid: [0.3, 0.19, 0.13],
	dark: [0.045, 0.04, 0.038]
};


/** Renders the pair; levels are relative to an 18 % grey at the reference exposure. */
export async function renderPair(c: SceneCase): Promise<RenderedPair> {
	const rand = random(c.seed);
	const W = WIDTH;
	const H = HEIGHT;
	const skyRows = Math.round(H * (0.25 + 0.2 * rand()));
	const coarse = noiseField(rand, W, H, 64);
	const medium = noiseField(rand, W, H, 14);
	const fine = noiseField(rand, W, H, 3);
	const { mask, bounds } = subjectMask(rand, W, H);
	const groundTint: Rgb = [0.9 + 0.2 * rand(), 1, 0.75 + 0.2 * rand()];
	const skyTint: Rgb = [0.75, 0.92, 1.25];
	const tone = TONES[c.subjectTone];
	const shade = 0.7 + 0.3 * rand();
	const day = lightColour(DAYLIGHT_K);
	const flashK = c.gel ? 1e6 / (1e6 / DAYLIGHT_K + CTO_MIRED) : DAYLIGHT_K;
	const flash = lightColour(flashK);
	const f0 = c.lift > 0 ? shade * (2 ** c.lift - 1) * 2 ** -(c.d + c.edit) : 0;
	const sideways = (rand() < 0.5 ? -1 : 1) * (0.3 + 0.4 * rand());
	const subjectWidth = Math.max(1, bounds.x1 - bounds.x0);
	const litScale = 2 ** -(c.d + c.edit);
	const gains = { ref: whiteBalanceGains(c.wbRef), lit: whiteBalanceGains(c.wbLit) };
	const lut = codeLut(c.curve);
	const refData = Buffer.alloc(W * H * 3);
	const litData = Buffer.alloc(W * H * 3);
	const lifts: number[] = [];
	const ratios: number[] = [];
	let subjectPixels = 0;
	let blown = 0;
	let bgPixels = 0;
	let bgClipped = 0;

	const refl = [0, 0, 0];
	const lumW = [0.2126, 0.7152, 0.0722];
	for (let y = 0; y < H; y++) {
		for (let x = 0; x < W; x++) {
			const i = y * W + x;
			const inSubject = mask[i] === 1;
			let ambient = 1;
			let flashIrr = 0;
			if (inSubject) {
				const t = 2 ** (0.25 * medium[i] + 0.15 * fine[i]);
				refl[0] = tone[0] * t;
				refl[1] = tone[1] * t;
				refl[2] = tone[2] * t;
				ambient = shade;
				// a flash to one side: inverse-square across the subject's width
				const u = (x - (bounds.x0 + bounds.x1) / 2) / subjectWidth;
				flashIrr = f0 / (1 + sideways * u) ** 2;
			} else if (y < skyRows) {
				// sky: brighter towards the horizon, slight cloud texture; stored as a reflectance under unit light
				const level = 0.18 * 2 ** (c.skyStops - 0.8 * (1 - y / skyRows) + 0.2 * coarse[i]);
				refl[0] = level * skyTint[0];
				refl[1] = level * skyTint[1];
				refl[2] = level * skyTint[2];
			} else {
				const t = 0.18 * 2 ** (0.7 * coarse[i] + 0.45 * medium[i] + 0.3 * fine[i] - 0.2);
				refl[0] = t * groundTint[0];
				refl[1] = t * groundTint[1];
				refl[2] = t * groundTint[2];
				// spill: the background is ten times farther than the subject, a hundredth of the flash (inverse-square)
				flashIrr = f0 * 0.01;
			}
			let refClip = false;
			let litClip = false;
			let a = 0;
			let f = 0;
			for (let k = 0; k < 3; k++) {
				const amb = refl[k] * ambient * day[k];
				const fl = refl[k] * flashIrr * flash[k] * gains.lit[k];
				const refLin = amb * gains.ref[k];
				const litAmb = amb * litScale * gains.lit[k];
				a += lumW[k] * litAmb;
				f += lumW[k] * fl;
				const rc = lut[Math.round(Math.min(1, refLin) * 16384)];
				const lc = lut[Math.round(Math.min(1, litAmb + fl) * 16384)];
				refData[3 * i + k] = rc;
				litData[3 * i + k] = lc;
				// blown as a file shows it: a channel at the top codes (CLIP_CODE in analysis/pixels.ts)
				if (rc >= CLIP_CODE) refClip = true;
				if (lc >= CLIP_CODE) litClip = true;
			}
			if (inSubject) {
				subjectPixels++;
				lifts.push(Math.log2((a + f) / a));
				ratios.push(flashIrr / (ambient * litScale));
				if (litClip && !refClip) blown++;
			} else {
				bgPixels++;
				if (refClip) bgClipped++;
			}
		}
	}

	const median = (v: number[]) => [...v].sort((a, b) => a - b)[Math.floor(v.length / 2)];
	// the light on a neutral surface of the subject, flash and ambient mixed, against the ambient alone
	const r = median(ratios);
	const mixed: Rgb = [0, 1, 2].map((k) => (day[k] + r * flash[k]) / day[k]) as Rgb;
	const neutral = miredOf([1, 1, 1]);
	const warm = miredOf(mixed);
	const pad = (c.looseness - 1) / 2;
	const bw = (bounds.x1 - bounds.x0) / W;
	const bh = (bounds.y1 - bounds.y0) / H;
	const bx = Math.max(0, bounds.x0 / W - pad * bw);
	const by = Math.max(0, bounds.y0 / H - pad * bh);
	const box: Box = { x: bx, y: by, w: Math.min(1 - bx, bw * c.looseness), h: Math.min(1 - by, bh * c.looseness) };

	const encode = async (data: Buffer, exif: Parameters<typeof buildExif>[0]) =>
		sharp(data, { raw: { width: W, height: H, channels: 3 } }).jpeg({ quality: c.quality }).withExif(buildExif(exif)).toBuffer();
	const refTime = (1 / 250) * 2 ** c.d;
	const [reference, lit] = await Promise.all([
		encode(refData, { ...REFERENCE_EXIF, exposureTime: refTime, flash: 0x10, whiteBalance: 1 }),
		encode(litData, { ...REFERENCE_EXIF, exposureTime: 1 / 250, flash: c.fired ? 0x19 : 0x10, whiteBalance: 1 })
	]);
	return {
		reference,
		lit,
		box,
		truth: {
			lift: median(lifts),
			drop: c.d + c.edit,
			warmerMired: warm === null || neutral === null ? null : warm - neutral,
			blownShare: subjectPixels ? blown / subjectPixels : 0,
			referenceClipped: bgPixels ? bgClipped / bgPixels : 0
		}
	};
}
