// A camera-like pipeline for the evaluation set: white-balance gains, sensor clipping, tone curves, 8-bit codes.
import { converter } from 'culori';
import { xyFromCct, xyzFromXy } from '../../exposure/index';

export type ToneCurve = 'srgb' | 'contrast' | 'flat';
export type Rgb = [number, number, number];

// culori's IEC 61966-2-1 encoding (independent of the engine's), tabulated once: linear 0–1 → encoded 0–1
const toSrgb = converter('rgb');
const toLrgb = converter('lrgb');
const LUT_SIZE = 4096;
const SRGB_LUT = Float64Array.from({ length: LUT_SIZE + 1 }, (_, i) => toSrgb({ mode: 'lrgb', r: i / LUT_SIZE, g: 0, b: 0 }).r);

function srgbEncode(x: number): number {
	const t = Math.min(1, Math.max(0, x)) * LUT_SIZE;
	const i = Math.min(LUT_SIZE - 1, Math.floor(t));
	return SRGB_LUT[i] + (SRGB_LUT[i + 1] - SRGB_LUT[i]) * (t - i);
}

// A contrast curve on encoded values pivoting near code 118 (mid-grey), S-shaped by a logistic; its mid-tone slope is
// about 1.5. Camera picture styles put an S-curve of this kind after the sRGB curve (common practice, no published source).
const PIVOT = 118 / 255;
function logistic(v: number, k: number): number {
	const s = (x: number) => 1 / (1 + Math.exp(-k * (x - PIVOT)));
	return (s(v) - s(0)) / (s(1) - s(0));
}
// the inverse of that S-curve, by bisection: a flat style lowers the mid-tone contrast the same way
function inverseLogistic(v: number, k: number): number {
	let lo = 0;
	let hi = 1;
	for (let i = 0; i < 30; i++) {
		const mid = (lo + hi) / 2;
		if (logistic(mid, k) < v) lo = mid;
		else hi = mid;
	}
	return (lo + hi) / 2;
}

const CURVES: Record<ToneCurve, (v: number) => number> = {
	srgb: (v) => v,
	// 60 % S-curve: mid-tone slope ≈ 1.3 against sRGB; shadows and highlights compressed
	contrast: (v) => 0.6 * logistic(v, 5) + 0.4 * v,
	// 50 % inverse S-curve: mid-tone slope ≈ 0.8, lifted shadows, gentler highlights
	flat: (v) => 0.5 * inverseLogistic(v, 5) + 0.5 * v
};

const CURVE_LUTS = new Map<ToneCurve, Uint8Array>();

/** Camera-linear value (0–1, clipped) → 8-bit code through sRGB and the picture style's curve, tabulated at 1/16384. */
export function codeLut(curve: ToneCurve): Uint8Array {
	let lut = CURVE_LUTS.get(curve);
	if (!lut) {
		lut = Uint8Array.from({ length: 16385 }, (_, i) => Math.round(255 * Math.min(1, Math.max(0, CURVES[curve](srgbEncode(i / 16384))))));
		CURVE_LUTS.set(curve, lut);
	}
	return lut;
}

/** Linear sRGB (culori) of a black body at `k` kelvin (Kang et al. 2002 locus), scaled to luminance 1. */
export function lightColour(k: number): Rgb {
	const [x, y, z] = xyzFromXy(xyFromCct(k), 1);
	const c = toLrgb({ mode: 'xyz65', x, y, z });
	return [c.r, c.g, c.b];
}

/** White-balance gains for a Kelvin setting: a light of that temperature renders neutral; green keeps its level. */
export function whiteBalanceGains(k: number): Rgb {
	const light = lightColour(k);
	return [light[1] / light[0], 1, light[1] / light[2]];
}
