// Renders a grey card lit at one colour temperature and white-balanced for another (the Gel Mixer's swatches).
import { formatHex, modeLrgb, modeOklab, modeOklch, modeRgb, toGamut, useMode } from 'culori/fn';
import { xyFromCct, xyzFromXy } from './chromaticity';
import { requirePositive } from './errors';
import { diag, invert, mulMat, mulVec, type Mat3 } from './matrix';
import { SRGB_WHITE_XYZ, xyzToLinearSrgb, type Xyz } from './srgb';

// culori's tree-shakeable entry needs the colour spaces its gamut mapping passes through registered once.
useMode(modeRgb);
useMode(modeLrgb);
useMode(modeOklab);
useMode(modeOklch);
const fitToSrgb = toGamut('rgb', 'oklch');

/** Bradford cone-response matrix (Lam 1985, as used in ICC and CIECAM97s). */
export const BRADFORD: Mat3 = [
	[0.8951, 0.2664, -0.1614],
	[-0.7502, 1.7135, 0.0367],
	[0.0389, -0.0685, 1.0296]
];
const BRADFORD_INV = invert(BRADFORD);

/** Bradford chromatic adaptation matrix taking colours seen under white `from` to white `to` (both XYZ). */
export function bradfordMatrix(from: Xyz, to: Xyz): Mat3 {
	const src = mulVec(BRADFORD, from);
	const dst = mulVec(BRADFORD, to);
	const scale = diag([dst[0] / src[0], dst[1] / src[1], dst[2] / src[2]]);
	return mulMat(BRADFORD_INV, mulMat(scale, BRADFORD));
}

/** XYZ adapted from white `from` to white `to` with the Bradford transform. */
export function adaptXyz(xyz: Xyz, from: Xyz, to: Xyz): Xyz {
	return mulVec(bradfordMatrix(from, to), xyz);
}

/** Swatch request: light colour temperature (K), camera white balance (K), card reflectance (default 0.18). */
export interface SwatchRequest {
	lightK: number;
	cameraWbK: number;
	reflectance?: number;
}

/** '#rrggbb' of a grey card under `lightK` kelvin photographed with white balance `cameraWbK` kelvin. */
// Both the light and the white-balance setting are taken on the Planckian locus (Kang et al.), 1667–25000 K: a
// camera's Kelvin setting assumes a black-body-like source. The camera maps its assumed white to sRGB's D65 white
// with Bradford; colours outside sRGB are brought in by culori's CSS Color 4 gamut mapping rather than clipped.
export function renderedSwatch(request: SwatchRequest): string {
	const lightWhite = xyzFromXy(xyFromCct(request?.lightK));
	const assumedWhite = xyzFromXy(xyFromCct(request.cameraWbK));
	const reflectance = requirePositive('reflectance', request.reflectance ?? 0.18);
	const card: Xyz = [lightWhite[0] * reflectance, lightWhite[1] * reflectance, lightWhite[2] * reflectance];
	const [r, g, b] = xyzToLinearSrgb(adaptXyz(card, assumedWhite, SRGB_WHITE_XYZ));
	return formatHex(fitToSrgb({ mode: 'lrgb', r, g, b }));
}
