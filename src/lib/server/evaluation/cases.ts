// The evaluation set: a seeded mix of correct, weak, flashless, edited, gelled and clipped pairs, and the Assignment graded.
import type { AssignmentSpecInput } from '../grading/index';
import { random, type SceneCase } from './scene';
import type { ToneCurve } from './camera';

/** The Assignment every pair is graded against: every pixel criterion, with the thresholds the truth is judged by. */
export const EVAL_SPEC: AssignmentSpecInput = {
	frames: ['reference', 'lit'],
	criteria: [
		{ kind: 'subject-lift', minStops: 1 },
		{ kind: 'flash-evidence', minLiftStops: 0.5 },
		{ kind: 'background-drop', tolerance: 0.5 },
		{ kind: 'background-cooler', minMired: 60 },
		{ kind: 'flash-share', share: 0.75, tolerance: 0.5 },
		{ kind: 'subject-clipping', maxPercent: 10 }
	]
};

const CURVES: ToneCurve[] = ['srgb', 'contrast', 'flat'];
const TONES: SceneCase['subjectTone'][] = ['light', 'mid', 'dark'];

/** `count` cases from `seed`; the same arguments always give the same set. */
export function makeCases(count: number, seed = 20261202): SceneCase[] {
	const rand = random(seed);
	const pick = <T>(list: readonly T[]) => list[Math.floor(rand() * list.length)];
	const cases: SceneCase[] = [];
	for (let n = 0; n < count; n++) {
		const kind = rand();
		const d = pick([1, 1.5, 2, 2.33]);
		const c: SceneCase = {
			id: '',
			seed: Math.floor(rand() * 2 ** 31),
			curve: CURVES[n % 3],
			quality: 80 + Math.floor(rand() * 16),
			d,
			edit: 0,
			lift: d + (rand() - 0.5),
			subjectTone: TONES[Math.floor(n / 3) % 3],
			skyStops: 0.8 + 1.4 * rand(),
			looseness: 1 + 0.7 * rand(),
			gel: false,
			wbLit: 5500,
			wbRef: 5500,
			fired: rand() < 0.7
		};
		let label = 'correct';
		if (kind < 0.12) {
			label = 'no-flash';
			c.lift = 0;
		} else if (kind < 0.24) {
			label = 'weak';
			c.lift = 0.15 + 0.9 * rand();
		} else if (kind < 0.34) {
			label = 'edited';
			// a stop either way, or 0.7 stop: small enough for a picture style to hide in the plain reading
			const u = rand();
			c.edit = (u < 0.5 ? -1 : 1) * (u < 0.25 || u >= 0.75 ? 1 : 0.7);
		} else if (kind < 0.54) {
			label = 'gel';
			c.gel = rand() < 0.7;
			c.wbLit = 3200;
			c.wbRef = rand() < 0.5 ? 3200 : 5500;
		} else if (kind < 0.64) {
			label = 'clipped-sky';
			c.skyStops = 2.9 + 0.6 * rand();
		} else if (kind < 0.7) {
			label = 'hot';
			c.lift = 3 + 1.5 * rand();
		}
		c.id = `${String(n).padStart(3, '0')}-${label}-${c.curve}-${c.subjectTone}`;
		cases.push(c);
	}
	return cases;
}
