// Scales and SVG paths for the widgets' small charts (pure, so they can be tested without a browser).

/** A point of a series: [x, y] in the chart's own units. */
export type ChartPoint = readonly [number, number];
/** One line on a chart, drawn in the flash (amber) or ambient (cobalt) colour. */
export interface ChartSeries {
	label: string;
	tone: 'flash' | 'ambient';
	points: readonly ChartPoint[];
}
/** An axis tick: where it sits and what it says. */
export interface ChartTick {
	value: number;
	label: string;
}

/** Linear map from a domain onto a pixel range (either may run backwards). */
export function scaleLinear(domain: readonly [number, number], range: readonly [number, number]): (v: number) => number {
	const [d0, d1] = domain;
	const [r0, r1] = range;
	const span = d1 - d0 || 1;
	return (v) => r0 + ((v - d0) / span) * (r1 - r0);
}

/** SVG path through the points; points with a non-finite coordinate break the line. */
export function linePath(points: readonly ChartPoint[], sx: (v: number) => number, sy: (v: number) => number): string {
	let path = '';
	let pen = false;
	for (const [x, y] of points) {
		if (!Number.isFinite(x) || !Number.isFinite(y)) {
			pen = false;
			continue;
		}
		path += `${pen ? 'L' : 'M'}${sx(x).toFixed(1)},${sy(y).toFixed(1)}`;
		pen = true;
	}
	return path;
}

/** `count` evenly spaced values from a to b inclusive (count ≥ 2). */
export function sampleRange(a: number, b: number, count: number): number[] {
	return Array.from({ length: count }, (_, i) => a + ((b - a) * i) / (count - 1));
}

/** The series' value at x, read along its line between the nearest points on either side; NaN off the line or in a gap. */
export function valueAt(points: readonly ChartPoint[], x: number): number {
	for (let k = 1; k < points.length; k++) {
		const [x0, y0] = points[k - 1];
		const [x1, y1] = points[k];
		if (x < Math.min(x0, x1) || x > Math.max(x0, x1)) continue;
		if (!Number.isFinite(y0) || !Number.isFinite(y1)) return NaN;
		return x1 === x0 ? y0 : y0 + ((x - x0) / (x1 - x0)) * (y1 - y0);
	}
	return NaN;
}

/**
 * The chart in words for whoever cannot see it: each series read at the x ticks, e.g.
 * "Flash at f/8: +1.3 at 2 m, −0.3 at 4 m". `value` formats a reading; ticks where a series has no value are left out.
 */
export function describeSeries(series: readonly ChartSeries[], xTicks: readonly ChartTick[], value: (y: number) => string): string {
	return series
		.map((s) => {
			const readings = xTicks.flatMap((t) => {
				const y = valueAt(s.points, t.value);
				return Number.isFinite(y) ? [`${value(y)} at ${t.label}`] : [];
			});
			return readings.length ? `${s.label}: ${readings.join(', ')}` : `${s.label}: no values`;
		})
		.join('; ');
}
