// Light Plan layout: preset positions in metres (x right, y up the page), plan bounds, and moving items by key or pointer.
import type { Point } from '$lib/exposure';
import { PLAN_HALF, type PlanLayout } from '$lib/attempts/light-plan';

export { MAX_LIGHTS, PLAN_HALF, type PlanLayout } from '$lib/attempts/light-plan';

/** The named starting layouts lessons can ask for. */
export const PLAN_PRESETS = ['rembrandt', 'cross', 'rim', 'on-axis'] as const;
export type PlanPreset = (typeof PLAN_PRESETS)[number];

/** Drawing scale and size of the square SVG plan. */
export const PX_PER_M = 40;
export const PLAN_PX = 2 * PLAN_HALF * PX_PER_M;

const R2 = Math.SQRT2;
const R3 = Math.sqrt(3);
// Subject at the centre facing the camera 3 m away; lights 2 m out unless the pattern needs otherwise.
const PRESETS: Record<PlanPreset, Point[]> = {
	// 45° from where the subject faces, to the camera's left.
	rembrandt: [{ x: -R2, y: -R2 }],
	// Key 45° in front on one side, a second light behind on the other side, twice as far (4 m).
	cross: [
		{ x: R2, y: -R2 },
		{ x: -2 * R2, y: 2 * R2 }
	],
	// Two lights behind the subject, 120° from the facing direction on each side.
	rim: [
		{ x: R3, y: 1 },
		{ x: -R3, y: 1 }
	],
	// A flash on or beside the camera.
	'on-axis': [{ x: 0.4, y: -2.9 }]
};

/** A fresh copy of a preset layout (safe to mutate). */
export function presetLayout(preset: PlanPreset): PlanLayout {
	return { camera: { x: 0, y: -3 }, subject: { x: 0, y: 0 }, lights: PRESETS[preset].map((p) => ({ ...p })) };
}

const EDGE = PLAN_HALF - 0.2;
const clamp = (v: number) => Math.min(EDGE, Math.max(-EDGE, v));
const tidy = (v: number) => Math.round(v * 100) / 100;

/** Keeps a point on the plan, to the centimetre. */
export function clampToPlan(p: Point): Point {
	return { x: tidy(clamp(p.x)), y: tidy(clamp(p.y)) };
}

const ARROWS: Record<string, [number, number]> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, 1], ArrowDown: [0, -1] };

/** Where an arrow key moves a point (0.1 m, or 0.5 m with Shift); null for any other key. */
export function nudge(p: Point, key: string, big: boolean): Point | null {
	const dir = ARROWS[key];
	if (!dir) return null;
	const step = big ? 0.5 : 0.1;
	return clampToPlan({ x: p.x + dir[0] * step, y: p.y + dir[1] * step });
}

/** Plan metres → SVG user units (y flipped so up the page is +y). */
export function toSvg(p: Point): { x: number; y: number } {
	return { x: (p.x + PLAN_HALF) * PX_PER_M, y: (PLAN_HALF - p.y) * PX_PER_M };
}

/** SVG user units → plan metres. */
export function fromSvg(x: number, y: number): Point {
	return { x: x / PX_PER_M - PLAN_HALF, y: PLAN_HALF - y / PX_PER_M };
}

const SPOTS: Point[] = [
	{ x: 2, y: 0 },
	{ x: -2, y: 0 },
	{ x: 0, y: 2 },
	{ x: 2, y: 2 },
	{ x: -2, y: 2 },
	{ x: 2, y: -2 }
];

/** A free spot for a newly added light: the first standard spot at least 0.6 m from every item. */
export function freeSpot(layout: PlanLayout): Point {
	const taken = [layout.camera, layout.subject, ...layout.lights];
	const free = SPOTS.find((s) => taken.every((t) => Math.hypot(t.x - s.x, t.y - s.y) >= 0.6));
	return { ...(free ?? SPOTS[0]) };
}
