// Shared benchmark plumbing: the Bench shape, warm-ups, medians and interleaved timing.
import { performance } from 'node:perf_hooks';

export interface BenchReport {
	/** Lines to print, already formatted. */
	lines: string[];
	/** false when the benchmark missed its target. */
	ok: boolean;
}

export interface Bench {
	name: string;
	run(): Promise<BenchReport>;
}

export interface TimingOptions {
	warmup: number;
	iterations: number;
}

export function median(values: readonly number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	const mid = sorted.length >> 1;
	return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/**
 * Times several tasks in turn, round after round, so drift in machine load hits each alike;
 * returns each task's median in milliseconds after the warm-up rounds.
 */
export async function timeInterleaved<K extends string>(
	tasks: Record<K, () => Promise<unknown>>,
	{ warmup, iterations }: TimingOptions
): Promise<Record<K, number>> {
	const names = Object.keys(tasks) as K[];
	const samples = Object.fromEntries(names.map((n) => [n, [] as number[]])) as Record<K, number[]>;
	for (let round = 0; round < warmup + iterations; round++) {
		for (const name of names) {
			const start = performance.now();
			await tasks[name]();
			const elapsed = performance.now() - start;
			if (round >= warmup) samples[name].push(elapsed);
		}
	}
	return Object.fromEntries(names.map((n) => [n, median(samples[n])])) as Record<K, number>;
}

export const ms = (value: number) => `${value.toFixed(1)} ms`;
