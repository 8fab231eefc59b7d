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
