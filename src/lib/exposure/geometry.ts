// Light Plan geometry (top view, metres): distances, the camera–subject–light angle and the portrait pattern it gives.
import { ExposureInputError, requireFinite } from './errors';

/** A point on the plan, in metres. Axes are mathematical: x to the right, y up the page, angles counter-clockwise. */
export interface Point {
	x: number;
	y: number;
}

/** Portrait lighting patterns told apart by the key light's angle from where the subject faces. */
export type LightPatternName = 'front' | 'loop' | 'rembrandt' | 'split' | 'rim';

// Common practice, no published source: horizontal angle (degrees from the subject's facing direction) where each
// pattern begins. Rembrandt also needs the key above eye level, which a top view cannot show.
/** Lower bound in degrees (from the facing direction) of each pattern; the next one's bound ends it. */
export const PATTERN_THRESHOLDS: Readonly<Record<LightPatternName, number>> = Object.freeze({
	front: 0,
	loop: 20,
	rembrandt: 40,
	split: 65,
	rim: 110
});

function checkPoint(name: string, p: unknown): Point {
	if (p === null || typeof p !== 'object') throw new ExposureInputError(`${name} must be a point { x, y } in metres`);
	const q = p as Point;
	return { x: requireFinite(`${name}.x`, q.x), y: requireFinite(`${name}.y`, q.y) };
}

/** Straight-line distance between two plan points, in metres. */
export function distance(a: Point, b: Point): number {
	const p = checkPoint('a', a);
	const q = checkPoint('b', b);
	return Math.hypot(q.x - p.x, q.y - p.y);
}

// Angle between two directions in degrees, 0–180; atan2 of cross and dot stays accurate near 0° and 180°.
function angleBetween(ux: number, uy: number, vx: number, vy: number): number {
	return (Math.atan2(Math.abs(ux * vy - uy * vx), ux * vx + uy * vy) * 180) / Math.PI;
}

/** Angle in degrees (0–180) at the subject between the camera and the light. */
export function angleAtSubject(camera: Point, subject: Point, light: Point): number {
	const c = checkPoint('camera', camera);
	const s = checkPoint('subject', subject);
	const l = checkPoint('light', light);
	if (distance(c, s) === 0) throw new ExposureInputError('camera and subject are at the same point: no angle');
	if (distance(l, s) === 0) throw new ExposureInputError('light and subject are at the same point: no angle');
	return angleBetween(c.x - s.x, c.y - s.y, l.x - s.x, l.y - s.y);
}

/** Where the subject faces: a point they look towards, or a heading in degrees (0 = +x, counter-clockwise). */
export type Facing = Point | number;

/** Pattern of a key light, with the angles used: from the subject's facing direction and camera–subject–light (degrees). */
export interface LightPatternResult {
	pattern: LightPatternName;
	/** Angle between where the subject faces and the light, in degrees (0–180). */
	angleFromFacing: number;
	/** Angle at the subject between camera and light, in degrees (0–180). */
	angleAtSubject: number;
	/** Which side of the subject's own face the light is on, for the plan's axes (mirror it if you draw y downwards). */
	side: 'left' | 'right' | 'centre';
}

/** Classifies the key light's pattern from the plan; the subject faces the camera unless `facing` says otherwise. */
export function lightPattern(args: { camera: Point; subject: Point; light: Point; facing?: Facing }): LightPatternResult {
	if (args === null || typeof args !== 'object') throw new ExposureInputError('light plan must be an object');
	const c = checkPoint('camera', args.camera);
	const s = checkPoint('subject', args.subject);
	const l = checkPoint('light', args.light);
	const atSubject = angleAtSubject(c, s, l);
	let fx: number;
	let fy: number;
	if (args.facing === undefined) {
		[fx, fy] = [c.x - s.x, c.y - s.y];
	} else if (typeof args.facing === 'number') {
		const rad = (requireFinite('facing', args.facing) * Math.PI) / 180;
		[fx, fy] = [Math.cos(rad), Math.sin(rad)];
	} else {
		const f = checkPoint('facing', args.facing);
		[fx, fy] = [f.x - s.x, f.y - s.y];
		if (fx === 0 && fy === 0) throw new ExposureInputError('facing point is the subject itself: no direction');
	}
	const lx = l.x - s.x;
	const ly = l.y - s.y;
	const fromFacing = angleBetween(fx, fy, lx, ly);
	// Counter-clockwise from the facing direction is the subject's own left (x right, y up).
	const cross = fx * ly - fy * lx;
	const side = Math.abs(cross) < 1e-12 * Math.hypot(fx, fy) * Math.hypot(lx, ly) ? 'centre' : cross > 0 ? 'left' : 'right';
	const order: LightPatternName[] = ['rim', 'split', 'rembrandt', 'loop', 'front'];
	const pattern = order.find((p) => fromFacing >= PATTERN_THRESHOLDS[p]) ?? 'front';
	return { pattern, angleFromFacing: fromFacing, angleAtSubject: atSubject, side };
}

/** Key-to-fill ratio as a number from their difference in stops (1 stop → 2, i.e. 2:1). */
export function keyFillRatio(stops: number): number {
	return 2 ** requireFinite('stops', stops);
}
