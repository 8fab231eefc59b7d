// Colour temperature ↔ CIE 1931 xy chromaticity (Planckian locus, McCamy CCT) and apparent CCT of linear sRGB.
import { ExposureInputError, requireFinite, requirePositive } from './errors';
import { linearSrgbToXyz, type LinearRgb, type Xyz } from './srgb';

/** A CIE 1931 chromaticity. */
export interface Chromaticity {
	x: number;
	y: number;
}

/** CIE illuminant A (2856 K) chromaticity, 2° observer (CIE 015:2004). */
export const ILLUMINANT_A: Chromaticity = Object.freeze({ x: 0.44757, y: 0.40745 });
/** CIE illuminant D65 chromaticity, 2° observer (CIE 015:2004). */
export const ILLUMINANT_D65: Chromaticity = Object.freeze({ x: 0.31271, y: 0.32902 });

/** Range in kelvin where the Kang et al. (2002) locus approximation holds. */
export const PLANCKIAN_RANGE_K = Object.freeze({ min: 1667, max: 25000 });

/** Chromaticity of a black body at `k` kelvin (Kang et al. 2002 cubic approximation, 1667–25000 K). */
export function xyFromCct(k: number): Chromaticity {
	const t = requirePositive('colour temperature', k, 'K');
	if (t < PLANCKIAN_RANGE_K.min || t > PLANCKIAN_RANGE_K.max) {
		throw new ExposureInputError(`colour temperature must be between 1667 K and 25000 K, got ${t} K`);
	}
	const u = 1e3 / t;
	const x =
		t <= 4000
			? -0.2661239 * u ** 3 - 0.2343589 * u ** 2 + 0.8776956 * u + 0.17991
			: -3.0258469 * u ** 3 + 2.1070379 * u ** 2 + 0.2226347 * u + 0.24039;
	const y =
		t <= 2222
			? -1.1063814 * x ** 3 - 1.3481102 * x ** 2 + 2.18555832 * x - 0.20219683
			: t <= 4000
				? -0.9549476 * x ** 3 - 1.37418593 * x ** 2 + 2.09137015 * x - 0.16748867
				: 3.081758 * x ** 3 - 5.8733867 * x ** 2 + 3.75112997 * x - 0.37001483;
	return { x, y };
}

/** Correlated colour temperature in kelvin from xy (McCamy 1992; good near the locus, weak above ~8000 K). */
export function cctFromXy(x: number, y: number): number {
	const cx = requireFinite('x', x);
	const cy = requireFinite('y', y);
	if (cx <= 0 || cy <= 0 || cx + cy >= 1) {
		throw new ExposureInputError(`(${cx}, ${cy}) is not a chromaticity: x and y must be positive with x + y < 1`);
	}
	if (cy === 0.1858) throw new ExposureInputError('y = 0.1858 is McCamy\'s epicentre: no colour temperature there');
	const n = (cx - 0.332) / (0.1858 - cy);
	return 449 * n ** 3 + 3525 * n ** 2 + 6823.3 * n + 5520.33;
}

/** XYZ of a chromaticity at luminance Y (default 1). */
export function xyzFromXy(c: Chromaticity, luminance = 1): Xyz {
	const x = requireFinite('x', c?.x);
	const y = requirePositive('y', c.y);
	return [(x / y) * luminance, luminance, ((1 - x - y) / y) * luminance];
}

/** Chromaticity of XYZ values, or null when there is no light (X + Y + Z ≤ 0). */
export function xyFromXyz(xyz: Xyz): Chromaticity | null {
	const sum = xyz[0] + xyz[1] + xyz[2];
	if (!(sum > 0)) return null;
	return { x: xyz[0] / sum, y: xyz[1] / sum };
}

/** Apparent colour temperature in kelvin of a linear sRGB colour (IEC matrix → xy → McCamy); null for black. */
// Only meaningful for near-neutral colours; callers judging a region should check it is roughly grey first.
export function apparentCct(rgb: LinearRgb): number | null {
	if (Array.isArray(rgb) && rgb.some((v) => typeof v === 'number' && v < 0)) {
		throw new ExposureInputError(`linear rgb values cannot be negative, got [${rgb.join(', ')}]`);
	}
	const c = xyFromXyz(linearSrgbToXyz(rgb));
	return c ? cctFromXy(c.x, c.y) : null;
}
