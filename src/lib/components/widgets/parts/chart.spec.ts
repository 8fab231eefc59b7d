// Chart scales and paths: linear mapping, broken lines at gaps, even samples.
import { describe, expect, it } from 'vitest';
import { linePath, sampleRange, scaleLinear } from './chart';

describe('chart helpers', () => {
	it('maps a domain linearly, also onto a reversed range (SVG y runs down)', () => {
		const y = scaleLinear([-4, 4], [166, 22]);
		expect(y(-4)).toBe(166);
		expect(y(0)).toBe(94);
		expect(y(4)).toBe(22);
	});
	it('lifts the pen over non-finite points', () => {
		const id = (v: number) => v;
		expect(linePath([[0, 0], [1, 1], [2, Number.NaN], [3, 3], [4, 4]], id, id)).toBe('M0.0,0.0L1.0,1.0M3.0,3.0L4.0,4.0');
	});
	it('samples both ends inclusive', () => {
		expect(sampleRange(1, 3, 5)).toEqual([1, 1.5, 2, 2.5, 3]);
	});
});
