// Chart scales and paths: linear mapping, broken lines at gaps, even samples.
import { describe, expect, it } from 'vitest';
import { describeSeries, linePath, sampleRange, scaleLinear, valueAt } from './chart';

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
	it('reads a line between its points, and not across a gap or off its ends', () => {
		const points = [[0, 0], [2, 4], [3, Number.NaN], [4, 1]] as const;
		expect(valueAt(points, 1)).toBe(2);
		expect(valueAt(points, 2)).toBe(4);
		expect(valueAt(points, 2.5)).toBeNaN();
		expect(valueAt(points, 5)).toBeNaN();
	});
	it('puts each series in words at the x ticks', () => {
		const series = [
			{ label: 'Flash', tone: 'flash' as const, points: [[1, 2], [2, 0], [4, -2]] as const },
			{ label: 'Ambient', tone: 'ambient' as const, points: [[3, 1], [4, 1]] as const }
		];
		const ticks = [1, 2, 4].map((v) => ({ value: v, label: `${v} m` }));
		expect(describeSeries(series, ticks, (y) => y.toFixed(1))).toBe('Flash: 2.0 at 1 m, 0.0 at 2 m, -2.0 at 4 m; Ambient: 1.0 at 4 m');
	});
});

