// Robust statistics for cell levels: median, quantiles and the median absolute deviation (any statistics text).

/** Linear-interpolated quantile q (0–1) of the values; NaN for none. */
export function quantile(values: readonly number[], q: number): number {
	if (values.length === 0) return NaN;
	const sorted = [...values].sort((a, b) => a - b);
	const at = (sorted.length - 1) * Math.min(1, Math.max(0, q));
	const lo = Math.floor(at);
	const hi = Math.ceil(at);
	return sorted[lo] + (sorted[hi] - sorted[lo]) * (at - lo);
}

export const median = (values: readonly number[]) => quantile(values, 0.5);

/** Median absolute deviation scaled by 1.4826, so it estimates σ for normal data (Hampel 1974). */
export function robustSpread(values: readonly number[]): number {
	if (values.length < 2) return NaN;
	const m = median(values);
	return 1.4826 * median(values.map((v) => Math.abs(v - m)));
}
