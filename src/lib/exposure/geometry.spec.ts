import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ExposureInputError } from './errors';
import { angleAtSubject, distance, keyFillRatio, lightPattern, PATTERN_THRESHOLDS, type Point } from './geometry';

const subject = { x: 0, y: 0 };
const camera = { x: 0, y: -5 };
// a light `deg` degrees round from the camera direction, 2 m from the subject, counter-clockwise
const at = (deg: number, r = 2): Point => {
	const a = ((-90 + deg) * Math.PI) / 180;
	return { x: r * Math.cos(a), y: r * Math.sin(a) };
};
const coord = fc.double({ min: -50, max: 50, noNaN: true });
const point = fc.record({ x: coord, y: coord });

describe('distance', () => {
	it('is Euclidean', () => {
		// Pythagoras: the 3-4-5 triangle
		expect(distance({ x: 1, y: 1 }, { x: 4, y: 5 })).toBe(5);
		expect(() => distance({ x: 1 } as Point, subject)).toThrow(ExposureInputError);
	});
});

describe('angleAtSubject', () => {
	it('measures the camera–subject–light angle in degrees', () => {
		// plane geometry
		expect(angleAtSubject(camera, subject, { x: 3, y: 0 })).toBeCloseTo(90, 9);
		expect(angleAtSubject(camera, subject, { x: 3, y: -3 })).toBeCloseTo(45, 9);
		expect(angleAtSubject(camera, subject, { x: 0, y: 4 })).toBeCloseTo(180, 9);
		expect(angleAtSubject(camera, subject, { x: 0, y: -1 })).toBeCloseTo(0, 9);
		expect(angleAtSubject(camera, subject, { x: -1, y: -Math.sqrt(3) })).toBeCloseTo(30, 9);
	});

	it('is symmetric in camera and light, within 0–180, and unchanged by moving or turning the plan', () => {
		fc.assert(
			fc.property(point, point, point, coord, coord, fc.double({ min: 0, max: 6.28, noNaN: true }), (c, s, l, dx, dy, turn) => {
				fc.pre(distance(c, s) > 1e-3 && distance(l, s) > 1e-3);
				const a = angleAtSubject(c, s, l);
				expect(a).toBeGreaterThanOrEqual(0);
				expect(a).toBeLessThanOrEqual(180);
				expect(angleAtSubject(l, s, c)).toBeCloseTo(a, 6);
				const move = (p: Point): Point => {
					const x = p.x * Math.cos(turn) - p.y * Math.sin(turn) + dx;
					const y = p.x * Math.sin(turn) + p.y * Math.cos(turn) + dy;
					return { x, y };
				};
				expect(angleAtSubject(move(c), move(s), move(l))).toBeCloseTo(a, 6);
			})
		);
	});

	it('refuses coincident points', () => {
		expect(() => angleAtSubject(subject, subject, { x: 1, y: 1 })).toThrow(/camera and subject/);
		expect(() => angleAtSubject(camera, subject, subject)).toThrow(/light and subject/);
	});
});

describe('lightPattern', () => {
	it('classifies a key light by its angle from a subject facing the camera', () => {
		// common practice, no published source: front < 20°, loop 20–40°, Rembrandt 40–65°, split 65–110°, rim beyond
		expect(lightPattern({ camera, subject, light: at(10) }).pattern).toBe('front');
		expect(lightPattern({ camera, subject, light: at(30) }).pattern).toBe('loop');
		expect(lightPattern({ camera, subject, light: at(45) }).pattern).toBe('rembrandt');
		expect(lightPattern({ camera, subject, light: at(90) }).pattern).toBe('split');
		expect(lightPattern({ camera, subject, light: at(150) }).pattern).toBe('rim');
		expect(lightPattern({ camera, subject, light: at(-45) }).pattern).toBe('rembrandt');
	});

	it('reports the angles it used and the side of the face', () => {
		const r = lightPattern({ camera, subject, light: at(45) });
		expect(r.angleFromFacing).toBeCloseTo(45, 9);
		expect(r.angleAtSubject).toBeCloseTo(45, 9);
		// facing −y (towards the camera), +x is the subject's own left
		expect(r.side).toBe('left');
		expect(lightPattern({ camera, subject, light: at(-45) }).side).toBe('right');
		expect(lightPattern({ camera, subject, light: at(0) }).side).toBe('centre');
	});

	it('starts each pattern at its threshold', () => {
		for (const [name, deg] of Object.entries(PATTERN_THRESHOLDS)) {
			expect(lightPattern({ camera, subject, light: at(deg + 1e-6) }).pattern).toBe(name);
		}
	});

	it('uses the facing direction, given as a heading or a point', () => {
		// subject turned 90° away from the camera (facing +x): a light beside the camera now splits the face
		const beside = { x: 0, y: -3 };
		const heading = lightPattern({ camera, subject, light: beside, facing: 0 });
		expect(heading.pattern).toBe('split');
		expect(heading.angleFromFacing).toBeCloseTo(90, 9);
		expect(heading.angleAtSubject).toBeCloseTo(0, 9);
		expect(lightPattern({ camera, subject, light: { x: 3, y: -3 }, facing: { x: 10, y: 0 } }).pattern).toBe('rembrandt');
		expect(lightPattern({ camera, subject, light: { x: -3, y: 0 }, facing: { x: 10, y: 0 } }).pattern).toBe('rim');
	});

	it('refuses a facing point on the subject', () => {
		expect(() => lightPattern({ camera, subject, light: at(45), facing: subject })).toThrow(ExposureInputError);
		expect(() => lightPattern({ camera, subject, light: at(45), facing: Number.NaN })).toThrow(ExposureInputError);
	});
});

describe('keyFillRatio', () => {
	it('turns a stop difference into a ratio', () => {
		// common practice, no published source: lighting ratio = 2^stops (1 stop → 2:1, 2 stops → 4:1)
		expect(keyFillRatio(0)).toBe(1);
		expect(keyFillRatio(1)).toBe(2);
		expect(keyFillRatio(2)).toBe(4);
		expect(keyFillRatio(Math.log2(3))).toBeCloseTo(3, 12);
		expect(() => keyFillRatio(Number.NaN)).toThrow(ExposureInputError);
	});
});
