// Where the athletes are: ground, background and sky of each invented location, as reflectances and sky radiance.
import type { Vec3 } from '../../exposure/matrix';
import { fbm, scatter, valueNoise } from './noise';

export type SettingKind = 'trail' | 'water' | 'wall' | 'field' | 'plaza';

/** A surface the camera sees: linear reflectance (albedo) and outward normal. */
export interface Surface {
	albedo: Vec3;
	normal: Vec3;
	/** For water: how much of the sky and background it mirrors (added as radiance). */
	mirror?: number;
}

/** The fixed geometry and materials of a location. */
export interface Setting {
	/** Depth of the background plane (hills, wall), in metres from the camera. */
	backgroundZ: number;
	/** Height of the background's top edge at x (metres), above which is sky. */
	skyline(x: number, seed: number): number;
	ground(x: number, z: number, seed: number): Surface;
	background(x: number, y: number, seed: number): Surface;
}

const UP: Vec3 = [0, 1, 0];
// distant hills and treelines slope towards the camera: lit like a slope, not like a wall
const HILLSIDE: Vec3 = [0, 0.8, -0.6];
const FACING: Vec3 = [0, 0, -1];

const scale = (c: Vec3, k: number): Vec3 => [c[0] * k, c[1] * k, c[2] * k];

const trail: Setting = {
	backgroundZ: 90,
	skyline: (x, seed) => 6 + 14 * fbm(x / 40, 0.5, seed + 7, 3),
	ground(x, z, seed) {
		// a dirt path winding through dry grass
		const path = Math.abs(x - 1.2 * Math.sin(z / 9) - 0.3) < 1.1 + 0.4 * valueNoise(z / 3, 1, seed);
		const n = fbm(x * 1.3, z * 1.3, seed + 11, 3);
		return { albedo: path ? scale([0.3, 0.21, 0.14], 0.7 + 0.5 * n) : scale([0.14, 0.15, 0.06], 0.55 + 0.8 * n), normal: UP };
	},
	background: (x, y, seed) => ({ albedo: scale([0.07, 0.1, 0.07], 0.7 + 0.6 * fbm(x / 6, y / 3, seed + 3, 3)), normal: HILLSIDE })
};

const field: Setting = {
	backgroundZ: 70,
	skyline: (x, seed) => 7 + 3 * fbm(x / 5, 0.5, seed + 5, 4),
	ground(x, z, seed) {
		// mown stripes and a painted line on the pitch
		const stripe = Math.floor(z / 4) % 2 === 0 ? 1 : 0.85;
		const line = Math.abs(z - 12) < 0.06;
		const n = fbm(x * 2, z * 2, seed + 13, 3);
		return { albedo: line ? [0.7, 0.7, 0.68] : scale([0.07, 0.16, 0.05], stripe * (0.75 + 0.5 * n)), normal: UP };
	},
	background: (x, y, seed) => ({ albedo: scale([0.05, 0.09, 0.05], 0.6 + 0.8 * fbm(x / 2, y / 2, seed + 9, 4)), normal: HILLSIDE })
};

const plaza: Setting = {
	backgroundZ: 45,
	skyline: (x, seed) => (Math.floor((x + 200) / 9) % 3 === 0 ? 9 : 6) + 2 * valueNoise(Math.floor((x + 200) / 9), 0, seed),
	ground(x, z, seed) {
		// concrete slabs with joints
		const joint = Math.abs(((x + 1000) % 3) - 1.5) > 1.47 || Math.abs((z % 3) - 1.5) > 1.47;
		const n = fbm(x * 3, z * 3, seed + 17, 3);
		return { albedo: scale([0.32, 0.31, 0.29], (joint ? 0.6 : 1) * (0.8 + 0.35 * n)), normal: UP };
	},
	background(x, y, seed) {
		// low club buildings: pale walls with dark windows
		const wx = (x + 1000) % 4;
		const window = y > 1.5 && y < 4.5 && wx > 1 && wx < 3;
		const n = fbm(x, y, seed + 19, 2);
		return { albedo: window ? [0.04, 0.05, 0.06] : scale([0.4, 0.36, 0.3], 0.8 + 0.3 * n), normal: FACING };
	}
};

const water: Setting = {
	backgroundZ: 140,
	skyline: (x, seed) => 5 + 8 * fbm(x / 30, 0.5, seed + 21, 4),
	ground(x, z, seed) {
		// dark, slightly green water mirroring the sky; ripples tilt the normal
		const r = fbm(x * 0.8, z * 2.5, seed + 23, 3) - 0.5;
		return { albedo: [0.02, 0.035, 0.03], normal: [0, 1, 0.25 * r], mirror: 0.3 };
	},
	background: (x, y, seed) => ({ albedo: scale([0.05, 0.08, 0.05], 0.6 + 0.8 * fbm(x / 4, y / 2, seed + 25, 4)), normal: HILLSIDE })
};

/** Where on the climbing wall the holds are: a jittered grid, one hold per cell. */
function holdAt(x: number, y: number, seed: number): Vec3 | null {
	const cell = 0.55;
	const cx = Math.floor(x / cell);
	const cy = Math.floor(y / cell);
	const id = (cx + 500) * 1000 + cy;
	const hx = (cx + 0.2 + 0.6 * scatter(id, seed)) * cell;
	const hy = (cy + 0.2 + 0.6 * scatter(id, seed + 1)) * cell;
	const r = 0.05 + 0.05 * scatter(id, seed + 2);
	if ((x - hx) ** 2 + (y - hy) ** 2 > r * r) return null;
	const colours: Vec3[] = [[0.5, 0.06, 0.04], [0.05, 0.2, 0.5], [0.55, 0.4, 0.03], [0.06, 0.3, 0.1], [0.4, 0.12, 0.4]];
	return colours[Math.floor(scatter(id, seed + 3) * colours.length)];
}

const wall: Setting = {
	backgroundZ: 8.4,
	skyline: () => 7.5,
	ground(x, z, seed) {
		// rubber safety matting at the foot of the wall
		const n = fbm(x * 4, z * 4, seed + 27, 2);
		return { albedo: scale([0.05, 0.05, 0.055], 0.8 + 0.4 * n), normal: UP };
	},
	background(x, y, seed) {
		const hold = holdAt(x, y, seed);
		if (hold) return { albedo: hold, normal: FACING };
		const seam = Math.abs(((x + 1000) % 1.22) - 0.61) > 0.6 || Math.abs((y % 1.22) - 0.61) > 0.6;
		const n = fbm(x * 3, y * 3, seed + 29, 3);
		return { albedo: scale([0.42, 0.38, 0.32], (seam ? 0.55 : 1) * (0.85 + 0.3 * n)), normal: FACING };
	}
};

export const settings: Readonly<Record<SettingKind, Setting>> = { trail, field, plaza, water, wall };

/** Sky radiance (linear sRGB under daylight) looking at elevation `e` (radians above the horizon), relative to an 18 % card in full daylight. */
// Common practice, no published source: a clear sky a stop or so brighter than middle grey near the horizon and
// darker and bluer overhead; values chosen by eye for the illustrations.
export function skyRadiance(e: number, azimuth: number, seed: number, overcast = false): Vec3 {
	const t = Math.min(1, Math.max(0, e / 0.6));
	if (overcast) {
		// a flat grey lid of cloud, a little brighter overhead
		const g = 0.42 + 0.1 * Math.sqrt(t) + 0.06 * (fbm(azimuth * 4, e * 8, seed + 37, 3) - 0.5);
		return [g, g * 1.01, g * 1.04];
	}
	const horizon: Vec3 = [0.5, 0.6, 0.75];
	const zenith: Vec3 = [0.07, 0.16, 0.42];
	const c: Vec3 = [0, 1, 2].map((i) => horizon[i] + (zenith[i] - horizon[i]) * Math.sqrt(t)) as unknown as Vec3;
	// a few thin clouds, brighter than the sky behind them
	const cloud = Math.max(0, fbm(azimuth * 6, e * 14, seed + 31, 4) - 0.55) * 1.6 * (1 - t * 0.5);
	return [c[0] + cloud * 0.9, c[1] + cloud * 0.9, c[2] + cloud * 0.85];
}
