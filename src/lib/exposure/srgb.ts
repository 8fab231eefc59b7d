// sRGB transfer function, linear sRGB ↔ CIE XYZ (D65) and relative luminance.
import { ExposureInputError, requireFinite } from './errors';
import { invert, mulVec, type Mat3, type Vec3 } from './matrix';

/** Linear-light RGB triple, each channel nominally 0–1. */
export type LinearRgb = Vec3;
/** CIE 1931 XYZ tristimulus values (Y = 1 for the reference white). */
export type Xyz = Vec3;

/** Linear sRGB → XYZ (D65) matrix as printed in IEC 61966-2-1:1999 (four decimals). */
export const SRGB_TO_XYZ: Mat3 = [
	[0.4124, 0.3576, 0.1805],
	[0.2126, 0.7152, 0.0722],
	[0.0193, 0.1192, 0.9505]
];

/** XYZ (D65) → linear sRGB, the exact inverse of SRGB_TO_XYZ so white round-trips to white. */
// The standard also prints a four-decimal inverse; inverting ours keeps equal-K swatches exactly neutral.
export const XYZ_TO_SRGB: Mat3 = invert(SRGB_TO_XYZ);

/** The white (R = G = B = 1) of SRGB_TO_XYZ in XYZ, i.e. sRGB's D65 white with Y = 1. */
export const SRGB_WHITE_XYZ: Xyz = mulVec(SRGB_TO_XYZ, [1, 1, 1]);

/** Encodes a linear-light value (0–1) with the sRGB transfer function (IEC 61966-2-1), unitless. */
// Negative values mirror the positive curve, as CSS Color 4 does, so out-of-gamut maths stays continuous.
export function srgbEncode(linear: number): number {
	const v = requireFinite('linear value', linear);
	const a = Math.abs(v);
	const e = a <= 0.0031308 ? 12.92 * a : 1.055 * a ** (1 / 2.4) - 0.055;
	return Math.sign(v) * e;
}

/** Decodes an sRGB-encoded value (0–1) to linear light (IEC 61966-2-1), unitless. */
export function srgbDecode(encoded: number): number {
	const v = requireFinite('encoded value', encoded);
	const a = Math.abs(v);
	const l = a <= 0.04045 ? a / 12.92 : ((a + 0.055) / 1.055) ** 2.4;
	return Math.sign(v) * l;
}

function checkTriple(name: string, v: unknown): Vec3 {
	if (!Array.isArray(v) || v.length !== 3) {
		throw new ExposureInputError(`${name} must be an array of three numbers [r, g, b], got ${String(v)}`);
	}
	return [requireFinite(`${name}[0]`, v[0]), requireFinite(`${name}[1]`, v[1]), requireFinite(`${name}[2]`, v[2])];
}

/** Relative luminance Y of linear sRGB with ITU-R BT.709 weights, unitless (0–1). */
export function relativeLuminance(rgb: LinearRgb): number {
	const [r, g, b] = checkTriple('rgb', rgb);
	return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** Linear sRGB → CIE XYZ (D65), with the IEC 61966-2-1 matrix. */
export function linearSrgbToXyz(rgb: LinearRgb): Xyz {
	return mulVec(SRGB_TO_XYZ, checkTriple('rgb', rgb));
}

/** CIE XYZ (D65) → linear sRGB (may fall outside 0–1 for colours outside the sRGB gamut). */
export function xyzToLinearSrgb(xyz: Xyz): LinearRgb {
	return mulVec(XYZ_TO_SRGB, checkTriple('xyz', xyz));
}
