// The scene drop fitted from background cells, against cells rendered here through culori's sRGB encoding (IEC
// 61966-2-1, independent of the engine's) and picture styles of our own making, with known drops.
import { converter } from 'culori';
import { describe, expect, it } from 'vitest';
import { fitSceneDrop, MIN_CURVE_SPAN } from './comparametric';

const toSrgb = converter('rgb');
const toLrgb = converter('lrgb');
const encode = (linear: number) => toSrgb({ mode: 'lrgb', r: Math.min(1, linear), g: 0, b: 0 }).r;
const decode = (code: number) => toLrgb({ mode: 'rgb', r: code, g: 0, b: 0 }).r;

/** Cells of a background spanning `span` stops around 18 % grey, through sRGB and `style`, as the analysis keeps them (linear). */
function cells(drop: number, style: (v: number) => number, span = 4, count = 200) {
	const ref: number[] = [];
	const lit: number[] = [];
	for (let i = 0; i < count; i++) {
		const scene = 0.18 * 2 ** (span * (i / (count - 1) - 0.5));
		// 8-bit codes, as a JPEG holds them
		const code = (v: number) => Math.round(255 * style(encode(v))) / 255;
		ref.push(decode(code(scene)));
		lit.push(decode(code(scene * 2 ** -drop)));
	}
	return { ref, lit };
}

const plain = (v: number) => v;
const cellsSpan = (span: number) => {
	const { ref, lit } = cells(2, plain, span);
	return fitSceneDrop(ref, lit, 2)!.levelSpan;
};
// a contrast S-curve about mid-grey: 0.6 of a smoothstep blended with the identity (our own picture style)
const contrasty = (v: number) => 0.4 * v + 0.6 * v * v * (3 - 2 * v);

describe('fitSceneDrop', () => {
	it('finds a 2-stop drop through plain sRGB and rules out half a stop either side', () => {
		const { ref, lit } = cells(2, plain);
		const fit = fitSceneDrop(ref, lit, 2)!;
		expect(fit.drop).toBeCloseTo(2, 1);
		expect(fit.misfitAt(1.5)).toBeGreaterThan(2);
		expect(fit.misfitAt(2.5)).toBeGreaterThan(2);
	});

	it('reads a contrasty style’s stretched drop back as the scene’s, where plain sRGB reads more', () => {
		const { ref, lit } = cells(1.5, contrasty);
		const plainReading = Math.log2(ref[100] / lit[100]);
		expect(plainReading).toBeGreaterThan(1.8);
		const fit = fitSceneDrop(ref, lit, 1.5)!;
		expect(Math.abs(fit.drop - 1.5)).toBeLessThanOrEqual(0.2);
		expect(fit.midSlope).toBeGreaterThan(1);
	});

	it('finds an edited frame’s true drop, a stop beyond the settings', () => {
		const { ref, lit } = cells(3, plain);
		const fit = fitSceneDrop(ref, lit, 2)!;
		expect(fit.drop).toBeCloseTo(3, 1);
		expect(fit.misfitAt(2)).toBeGreaterThan(2);
	});

	it('cannot rule out another drop on a background of one level, and says it spans no levels', () => {
		const { ref, lit } = cells(2, plain, 0);
		const fit = fitSceneDrop(ref, lit, 2)!;
		expect(Math.min(fit.misfitAt(1.5), fit.misfitAt(2.5))).toBeLessThan(2);
		expect(fit.levelSpan).toBeLessThan(MIN_CURVE_SPAN);
		expect(cellsSpan(4)).toBeGreaterThan(3);
	});

	it('needs a dozen cells', () => {
		const { ref, lit } = cells(2, plain, 4, 11);
		expect(fitSceneDrop(ref, lit, 2)).toBeNull();
	});
});
