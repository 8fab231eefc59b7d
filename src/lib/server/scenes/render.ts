// Renders a scene in linear light: daylight from the meter's EV, off-camera flashes by guide number and inverse
// square from where they stand, a Kelvin white balance; returns linear sRGB (not yet clipped or encoded).
import type { Vec3 } from '../../exposure/matrix';
import { athleteParts, type AthleteKind, type Material, type Part } from './athletes';
import { ambientScale, beamFactor, DAYLIGHT_K, flashKelvin, flashScale, lightRgb, whiteBalanceMatrix, type Camera, type Flash } from './light';
import { settings, skyRadiance, type SettingKind, type Surface } from './settings';

/** An athlete in the scene: which, where (feet at x, y above the ground, z metres from the camera) and in what colours. */
export interface AthletePlacement {
	kind: AthleteKind;
	x: number;
	y?: number;
	z: number;
	mirror?: boolean;
	palette: Record<Material, Vec3>;
	/** Speed across the frame in m/s: the shutter smears the daylight-lit athlete, the short flash freezes it. */
	speed?: number;
}

/** A scene: location, the daylight (meter EV100 off an 18 % card in full light, sun direction, share of light from the sky), the athlete and the camera's place. */
export interface Scene {
	setting: SettingKind;
	seed: number;
	sceneEv: number;
	/** Direction towards the sun (camera looks along +z, y up): a sun behind the athlete has a positive z. */
	sun: Vec3;
	/** Share of the daylight on the ground that comes from the open sky rather than the sun (0–1). */
	skyShare: number;
	/** A clear blue sky (default) or a grey overcast one. */
	overcast?: boolean;
	athlete: AthletePlacement;
	/** Camera height above the ground in metres, focal length in 35 mm terms, and where the horizon sits (fraction of the height from the top). */
	view: { height: number; focal35: number; horizon: number; pan?: number };
}

/** A frame in linear light: width × height pixels, three floats each (linear sRGB after white balance). */
export interface LinearFrame {
	width: number;
	height: number;
	data: Float32Array;
}

export interface RenderOptions {
	width: number;
	height: number;
	/** Samples per pixel along each axis (2 = four samples per pixel). */
	supersample?: number;
	/** Moments sampled across the shutter time when the athlete moves. */
	timeSamples?: number;
	/** Leave out the daylight or the flash (to measure one on its own). */
	only?: 'ambient' | 'flash';
}

interface Hit {
	surface: Surface;
	point: Vec3;
	sky?: Vec3;
}

const norm = (v: Vec3): Vec3 => {
	const l = Math.hypot(v[0], v[1], v[2]);
	return [v[0] / l, v[1] / l, v[2] / l];
};

/** Where a part is nearest to a point of its plane: the distance to its surface (negative inside) and the tube's local radius. */
function partDistance(p: Part, x: number, y: number): { d: number; vx: number; vy: number; r: number } {
	if (p.kind === 'ring') {
		const dx = x - p.c[0];
		const dy = y - p.c[1];
		const len = Math.hypot(dx, dy) || 1e-9;
		const vx = dx - (dx / len) * p.radius;
		const vy = dy - (dy / len) * p.radius;
		return { d: Math.hypot(vx, vy) - p.r, vx, vy, r: p.r };
	}
	const [ax, ay] = p.a;
	const bx = p.b[0] - ax;
	const by = p.b[1] - ay;
	const l2 = bx * bx + by * by;
	const t = l2 === 0 ? 0 : Math.min(1, Math.max(0, ((x - ax) * bx + (y - ay) * by) / l2));
	const vx = x - (ax + t * bx);
	const vy = y - (ay + t * by);
	const r = p.r + ((p.r2 ?? p.r) - p.r) * t;
	return { d: Math.hypot(vx, vy) - r, vx, vy, r };
}

/** Bounding box of the parts (metres), so most pixels skip the athlete test. */
function boundsOf(parts: Part[]) {
	let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
	for (const p of parts) {
		const pts = p.kind === 'ring' ? [p.c] : [p.a, p.b];
		const pad = p.kind === 'ring' ? p.radius + p.r : Math.max(p.r, p.r2 ?? 0);
		for (const [x, y] of pts) {
			x0 = Math.min(x0, x - pad); x1 = Math.max(x1, x + pad);
			y0 = Math.min(y0, y - pad); y1 = Math.max(y1, y + pad);
		}
	}
	return { x0, y0, x1, y1 };
}

/** Renders `scene` as `camera` records it with `flashes` firing. */
export function renderScene(scene: Scene, camera: Camera, flashes: Flash[], options: RenderOptions): LinearFrame {
	const { width, height } = options;
	const ss = options.supersample ?? 2;
	const moving = (scene.athlete.speed ?? 0) > 0;
	const times = moving ? (options.timeSamples ?? 8) : 1;
	const setting = settings[scene.setting];
	const parts = athleteParts(scene.athlete.kind, scene.athlete.mirror);
	const box = boundsOf(parts);
	const { height: camH, focal35, horizon, pan = 0 } = scene.view;
	// a 35 mm frame is 24 mm high: focal length in pixels from the lens's 35 mm equivalent
	const f = (focal35 / 24) * height;
	const cy = horizon * height;
	const cx = width / 2;

	const ambient = options.only === 'flash' ? 0 : ambientScale(scene.sceneEv, camera);
	const daylight = lightRgb(DAYLIGHT_K);
	const lit = options.only === 'ambient' ? [] : flashes.map((fl) => ({ fl, rgb: lightRgb(flashKelvin(fl)) }));
	const sun = norm(scene.sun);
	// the sun's share is set so level ground in full light reflects exactly its albedo: the meter's reference
	const sunShare = sun[1] > 0 ? (1 - scene.skyShare) / sun[1] : 0;
	const ambientFactor = (n: Vec3) =>
		sunShare * Math.max(0, n[0] * sun[0] + n[1] * sun[1] + n[2] * sun[2]) + scene.skyShare * (0.5 + 0.5 * n[1]);

	const athlete = scene.athlete;
	const ay = athlete.y ?? 0;

	/** What the ray through (dx, dy, 1) meets: the athlete (shifted `shift` metres), the ground, the background or the sky. */
	const trace = (dx: number, dy: number, shift: number): Hit => {
		// the athlete stands in a vertical plane at depth z
		const z = athlete.z;
		const lx = dx * z - athlete.x - shift;
		const ly = camH + dy * z - ay;
		if (lx >= box.x0 && lx <= box.x1 && ly >= box.y0 && ly <= box.y1) {
			let best: { p: Part; vx: number; vy: number; r: number } | null = null;
			for (const p of parts) {
				const q = partDistance(p, lx, ly);
				if (q.d <= 0) best = { p, vx: q.vx, vy: q.vy, r: q.r };
			}
			if (best) {
				// a tube seen from the side: the normal turns from the camera towards the edge
				const nx = best.vx / best.r;
				const ny = best.vy / best.r;
				const nz = -Math.sqrt(Math.max(0, 1 - nx * nx - ny * ny));
				const surface: Surface = { albedo: athlete.palette[best.p.material], normal: [nx, ny, nz] };
				return { surface, point: [lx + athlete.x + shift, ly + ay, z + nz * best.r] };
			}
		}
		const bz = setting.backgroundZ;
		if (dy < 0) {
			const t = camH / -dy;
			if (t < bz) {
				const x = dx * t;
				const surface = setting.ground(x, t, scene.seed);
				const point: Vec3 = [x, 0, t];
				if (!surface.mirror) return { surface, point };
				// water mirrors what lies above it: the background or the sky along the reflected ray
				const ry = -dy + surface.normal[2] * 0.15;
				const yAtBg = (bz - t) * ry;
				const xAtBg = dx * bz;
				const reflected = yAtBg < setting.skyline(xAtBg, scene.seed)
					? scaleVec(setting.background(xAtBg, yAtBg, scene.seed).albedo, ambientFactor([0, 0.8, -0.6]))
					: skyRadiance(Math.atan(ry), Math.atan(dx), scene.seed, scene.overcast);
				return { surface, point, sky: scaleVec(reflected, surface.mirror) };
			}
		}
		const x = dx * bz;
		const y = camH + dy * bz;
		if (y < setting.skyline(x, scene.seed)) return { surface: setting.background(x, y, scene.seed), point: [x, y, bz] };
		return { surface: { albedo: [0, 0, 0], normal: [0, 0, -1] }, point: [x, y, bz], sky: skyRadiance(Math.atan(dy), Math.atan(dx), scene.seed, scene.overcast) };
	};

	/** Linear light (before white balance) arriving from one hit: daylight and each flash. */
	const shade = (hit: Hit, withAmbient: boolean, withFlash: boolean, out: number[]) => {
		const { albedo, normal } = hit.surface;
		if (withAmbient) {
			const a = ambientFactor(normal) * ambient;
			for (let c = 0; c < 3; c++) out[c] += albedo[c] * daylight[c] * a + (hit.sky ? hit.sky[c] * daylight[c] * ambient : 0);
		}
		if (!withFlash) return;
		for (const { fl, rgb } of lit) {
			const lx = fl.at[0] - hit.point[0];
			const ly = fl.at[1] - hit.point[1];
			const lz = fl.at[2] - hit.point[2];
			const d = Math.hypot(lx, ly, lz);
			const cos = (normal[0] * lx + normal[1] * ly + normal[2] * lz) / d;
			if (cos <= 0 || d > 200) continue;
			const e = flashScale(fl, camera, d) * cos * beamFactor(fl, [-lx / d, -ly / d, -lz / d]);
			for (let c = 0; c < 3; c++) out[c] += albedo[c] * rgb[c] * e;
		}
	};

	const wb = whiteBalanceMatrix(camera.wbK);
	const data = new Float32Array(width * height * 3);
	const acc = [0, 0, 0];
	const shutterSpan = (athlete.speed ?? 0) * camera.shutter;
	const halfSpan = Math.abs(shutterSpan) / 2;
	for (let py = 0; py < height; py++) {
		for (let px = 0; px < width; px++) {
			acc[0] = acc[1] = acc[2] = 0;
			for (let sy = 0; sy < ss; sy++) {
				for (let sx = 0; sx < ss; sx++) {
					const dx = (px + (sx + 0.5) / ss - cx) / f + pan;
					const dy = (cy - (py + (sy + 0.5) / ss)) / f;
					// daylight integrates over the whole shutter time; the flash fires once, mid-exposure. Rays that
					// miss the athlete's swept box see a still world: one moment is enough there.
					const lx = dx * athlete.z - athlete.x;
					const ly = camH + dy * athlete.z - ay;
					const swept = lx >= box.x0 - halfSpan && lx <= box.x1 + halfSpan && ly >= box.y0 && ly <= box.y1;
					const n = swept ? times : 1;
					for (let k = 0; k < n; k++) {
						const shift = n === 1 ? 0 : shutterSpan * ((k + 0.5) / n - 0.5);
						const hit = trace(dx, dy, shift);
						const w = 1 / n;
						const part = [0, 0, 0];
						shade(hit, ambient > 0, false, part);
						for (let c = 0; c < 3; c++) acc[c] += part[c] * w;
					}
					if (lit.length > 0) {
						const part = [0, 0, 0];
						shade(trace(dx, dy, 0), false, true, part);
						for (let c = 0; c < 3; c++) acc[c] += part[c];
					}
				}
			}
			const samples = ss * ss;
			const r = acc[0] / samples, g = acc[1] / samples, b = acc[2] / samples;
			const i = (py * width + px) * 3;
			data[i] = wb[0][0] * r + wb[0][1] * g + wb[0][2] * b;
			data[i + 1] = wb[1][0] * r + wb[1][1] * g + wb[1][2] * b;
			data[i + 2] = wb[2][0] * r + wb[2][1] * g + wb[2][2] * b;
		}
	}
	return { width, height, data };
}

function scaleVec(v: Vec3, k: number): Vec3 {
	return [v[0] * k, v[1] * k, v[2] * k];
}
