// Stylised athlete silhouettes (invented, simple round shapes) for the rendered illustrations, in metres.
// An athlete is a list of parts drawn back to front in a vertical plane facing the camera; x runs in the
// direction of travel, y up from the ground (or the boat, the wall's foot) at the origin.

/** What a part is made of; each athlete's palette gives it a colour. */
export type Material = 'skin' | 'hair' | 'top' | 'bottom' | 'shoe' | 'gear' | 'accent';

/** A round-ended tube from a to b (radius r at a, r2 at b), or a ring (a wheel) around c. */
export type Part =
	| { kind: 'capsule'; a: [number, number]; b: [number, number]; r: number; r2?: number; material: Material }
	| { kind: 'ring'; c: [number, number]; radius: number; r: number; material: Material };

export type AthleteKind = 'runner' | 'rower' | 'climber' | 'disc' | 'bmx';

type P = [number, number];
const cap = (a: P, b: P, r: number, material: Material, r2?: number): Part => ({ kind: 'capsule', a, b, r, r2, material });
const dot = (c: P, r: number, material: Material): Part => cap(c, c, r, material);
const ring = (c: P, radius: number, r: number, material: Material): Part => ({ kind: 'ring', c, radius, r, material });

/** A limb as two tubes (upper and lower) with a joint between; the upper part may wear clothing. */
function limb(from: P, joint: P, to: P, r: number, upper: Material, lower: Material): Part[] {
	return [cap(from, joint, r, upper, r * 0.85), cap(joint, to, r * 0.85, lower, r * 0.7)];
}

function head(c: P): Part[] {
	return [dot(c, 0.105, 'skin'), cap([c[0] - 0.03, c[1] + 0.04], [c[0] + 0.02, c[1] + 0.06], 0.085, 'hair')];
}

const runner = (): Part[] => [
	...limb([0.02, 1.38], [-0.2, 1.18], [-0.3, 1.34], 0.045, 'top', 'skin'),
	...limb([-0.02, 0.95], [-0.18, 0.56], [-0.44, 0.26], 0.075, 'bottom', 'skin'),
	cap([-0.44, 0.26], [-0.56, 0.2], 0.045, 'shoe'),
	cap([0.06, 1.42], [-0.02, 0.98], 0.15, 'top', 0.13),
	cap([-0.02, 0.98], [0.0, 0.9], 0.14, 'bottom'),
	...limb([0.0, 0.95], [0.32, 0.7], [0.24, 0.3], 0.08, 'bottom', 'skin'),
	cap([0.24, 0.28], [0.38, 0.27], 0.045, 'shoe'),
	cap([0.09, 1.5], [0.1, 1.56], 0.05, 'skin'),
	...head([0.14, 1.66]),
	...limb([0.08, 1.38], [0.2, 1.14], [0.36, 1.26], 0.045, 'top', 'skin')
];

const rower = (): Part[] => [
	// the shell sits on the water; the rower leans back at the finish of the stroke
	cap([-1.9, 0.12], [1.9, 0.1], 0.1, 'gear', 0.05),
	cap([-1.9, 0.2], [1.9, 0.18], 0.03, 'accent'),
	...limb([-0.1, 0.38], [0.3, 0.7], [0.62, 0.3], 0.075, 'bottom', 'skin'),
	cap([-0.1, 0.36], [-0.32, 0.95], 0.15, 'top', 0.13),
	cap([-0.32, 1.05], [-0.32, 1.1], 0.05, 'skin'),
	...head([-0.34, 1.2]),
	...limb([-0.3, 0.95], [-0.05, 0.78], [0.12, 0.86], 0.045, 'top', 'skin'),
	// the oar handle at the hands, the loom running out past the rigger to the blade in the water
	cap([0.12, 0.86], [1.3, 0.22], 0.022, 'gear'),
	cap([1.3, 0.22], [1.6, 0.05], 0.07, 'accent', 0.05)
];

const climber = (): Part[] => [
	// reaching for a hold up and right, weight on the left foot; seen from behind, facing the wall
	cap([0.05, 2.6], [0.05, 1.6], 0.012, 'accent'),
	...limb([-0.1, 0.92], [-0.34, 0.6], [-0.3, 0.2], 0.08, 'bottom', 'bottom'),
	cap([-0.3, 0.2], [-0.42, 0.16], 0.045, 'shoe'),
	...limb([0.1, 0.92], [0.36, 0.8], [0.32, 0.42], 0.08, 'bottom', 'bottom'),
	cap([0.32, 0.42], [0.44, 0.4], 0.045, 'shoe'),
	cap([0.0, 1.42], [0.0, 0.98], 0.15, 'top', 0.14),
	cap([-0.15, 0.96], [0.15, 0.96], 0.06, 'gear'),
	...limb([-0.12, 1.38], [-0.36, 1.6], [-0.3, 1.92], 0.045, 'skin', 'skin'),
	...limb([0.12, 1.38], [0.3, 1.7], [0.46, 2.02], 0.045, 'skin', 'skin'),
	cap([0.0, 1.5], [0.0, 1.56], 0.05, 'skin'),
	dot([0.0, 1.66], 0.108, 'hair')
];

const disc = (): Part[] => [
	// airborne, reaching up for the disc; feet off the ground
	...limb([-0.04, 1.3], [-0.28, 1.14], [-0.44, 1.2], 0.045, 'top', 'skin'),
	...limb([-0.02, 0.9], [-0.1, 0.55], [-0.34, 0.38], 0.08, 'bottom', 'skin'),
	cap([-0.34, 0.38], [-0.44, 0.3], 0.045, 'shoe'),
	cap([0.02, 1.36], [-0.02, 0.92], 0.15, 'top', 0.13),
	cap([-0.02, 0.94], [0.0, 0.84], 0.14, 'bottom'),
	...limb([0.0, 0.9], [0.28, 0.78], [0.22, 0.42], 0.08, 'bottom', 'skin'),
	cap([0.22, 0.42], [0.34, 0.4], 0.045, 'shoe'),
	cap([0.04, 1.44], [0.05, 1.5], 0.05, 'skin'),
	...head([0.07, 1.6]),
	...limb([0.06, 1.34], [0.22, 1.62], [0.36, 1.92], 0.045, 'top', 'skin'),
	cap([0.26, 2.0], [0.52, 2.02], 0.022, 'accent')
];

const bmx = (): Part[] => [
	// flatland: standing on the pegs, crouched over the bars
	ring([-0.5, 0.25], 0.23, 0.035, 'gear'),
	ring([0.52, 0.25], 0.23, 0.035, 'gear'),
	cap([-0.5, 0.25], [-0.02, 0.3], 0.025, 'accent'),
	cap([-0.02, 0.3], [0.36, 0.55], 0.028, 'accent'),
	cap([-0.5, 0.25], [-0.12, 0.55], 0.022, 'accent'),
	cap([-0.12, 0.55], [0.36, 0.58], 0.025, 'accent'),
	cap([0.36, 0.58], [0.52, 0.25], 0.022, 'accent'),
	cap([0.36, 0.58], [0.3, 0.86], 0.022, 'gear'),
	cap([0.22, 0.88], [0.4, 0.86], 0.02, 'gear'),
	...limb([-0.14, 0.92], [0.1, 0.66], [-0.02, 0.34], 0.08, 'bottom', 'bottom'),
	cap([-0.02, 0.32], [0.1, 0.3], 0.045, 'shoe'),
	cap([0.12, 1.32], [-0.14, 0.95], 0.15, 'top', 0.14),
	...limb([-0.14, 0.92], [-0.38, 0.66], [-0.5, 0.34], 0.08, 'bottom', 'bottom'),
	cap([-0.5, 0.32], [-0.38, 0.3], 0.045, 'shoe'),
	cap([0.18, 1.42], [0.2, 1.48], 0.05, 'skin'),
	dot([0.25, 1.58], 0.125, 'accent'),
	...limb([0.14, 1.3], [0.28, 1.08], [0.32, 0.88], 0.045, 'top', 'skin')
];

const poses: Record<AthleteKind, () => Part[]> = { runner, rower, climber, disc, bmx };

/** The parts of an athlete, back to front; `mirror` makes them travel right to left. */
export function athleteParts(kind: AthleteKind, mirror = false): Part[] {
	const parts = poses[kind]();
	if (!mirror) return parts;
	const flip = (p: P): P => [-p[0], p[1]];
	return parts.map((p) => (p.kind === 'ring' ? { ...p, c: flip(p.c) } : { ...p, a: flip(p.a), b: flip(p.b) }));
}
