// Grades the evaluation set and scores each criterion against the truth the renderer knows.
import { readFrame } from '../analysis/index';
import { grade, type CriterionResult } from '../grading/index';
import { EVAL_SPEC } from './cases';
import { renderPair, type SceneCase, type SceneTruth } from './scene';

export interface CaseOutcome {
	case: SceneCase;
	truth: SceneTruth;
	criteria: CriterionResult[];
}

interface Judged {
	/** Whether the criterion truly passes. */
	pass: boolean;
	/** The true value of what `measured` estimates; null when there is nothing to compare. */
	value: number | null;
}

const ratioOf = (lift: number) => (lift > 0.05 ? Math.log2(2 ** lift - 1) : null);

/** The truth of each criterion of EVAL_SPEC, by kind. */
export const TRUTH: Record<string, { unit: string; judge: (t: SceneTruth, c: SceneCase) => Judged }> = {
	'subject-lift': { unit: 'stops', judge: (t) => ({ pass: t.lift >= 1, value: t.lift }) },
	'flash-evidence': { unit: 'stops', judge: (t) => ({ pass: t.lift >= 0.5, value: t.lift }) },
	'background-drop': { unit: 'stops', judge: (t, c) => ({ pass: Math.abs(t.drop - c.d) <= 0.5, value: t.drop }) },
	'background-cooler': { unit: 'mired', judge: (t) => ({ pass: t.lift >= 0.5 && (t.warmerMired ?? 0) >= 60, value: t.lift >= 0.5 ? t.warmerMired : 0 }) },
	'flash-share': {
		unit: 'stops',
		judge: (t) => {
			const r = ratioOf(t.lift);
			return { pass: r !== null && Math.abs(r - Math.log2(3)) <= 0.5, value: r };
		}
	},
	'subject-clipping': { unit: '% points', judge: (t) => ({ pass: t.blownShare <= 0.1, value: 100 * t.blownShare }) }
};

export async function runCase(c: SceneCase): Promise<CaseOutcome> {
	const pair = await renderPair(c);
	const [reference, lit] = await Promise.all([readFrame(pair.reference, { subject: pair.box }), readFrame(pair.lit, { subject: pair.box })]);
	return { case: c, truth: pair.truth, criteria: grade(EVAL_SPEC, { reference, lit }).criteria };
}

export interface CriterionScore {
	kind: string;
	unit: string;
	n: number;
	/** Median and 95th percentile of |measured − true|, over the results with a measured value (not a mere bound). */
	medianError: number;
	p95Error: number;
	measuredCount: number;
	/** 95th percentile of |measured − true| over the results that passed or failed (the ones no mentor checks). */
	p95Decided: number;
	/** Results whose measure was only a bound or a range (a blown-out subject, a weak flash): not counted in the errors. */
	bounds: number;
	/** Of those, the ones the truth lies outside of (a bound that is wrong). */
	boundMisses: number;
	falsePasses: number;
	falseFails: number;
	unknowns: number;
	/** Case ids of the false passes and false fails. */
	wrong: string[];
}

function quantile(values: number[], q: number): number {
	if (values.length === 0) return NaN;
	const s = [...values].sort((a, b) => a - b);
	return s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)] ?? s[0];
}

export function score(outcomes: CaseOutcome[]): CriterionScore[] {
	return Object.entries(TRUTH).map(([kind, { unit, judge }]) => {
		const errors: number[] = [];
		const decided: number[] = [];
		let bounds = 0;
		let boundMisses = 0;
		let falsePasses = 0;
		let falseFails = 0;
		let unknowns = 0;
		const wrong: string[] = [];
		for (const o of outcomes) {
			const r = o.criteria.find((c) => c.kind === kind);
			if (!r) continue;
			const t = judge(o.truth, o.case);
			if (r.verdict === 'unknown') unknowns++;
			if (r.verdict === 'pass' && !t.pass) {
				falsePasses++;
				wrong.push(`${o.case.id} (false pass)`);
			}
			if (r.verdict === 'fail' && t.pass) {
				falseFails++;
				wrong.push(`${o.case.id} (false fail)`);
			}
			const m = kind === 'subject-clipping' ? (r.evidence?.blownPercent ?? null) : typeof r.measured === 'number' ? r.measured : null;
			const e = r.evidence;
			if (kind !== 'subject-clipping' && (e?.lowerBound || e?.upperBound || e?.ratioRange)) {
				bounds++;
				// a bound stated with an uncertainty ("at least 2 stops, ± 0.3") holds when the truth is within it
				const slack = e.uncertainty ?? 0;
				const [low, high] = e.ratioRange ?? [e.lowerBound && m !== null ? m - slack : null, e.upperBound && m !== null ? m + slack : null];
				if (t.value !== null && ((low !== null && t.value < low) || (high !== null && t.value > high))) boundMisses++;
			} else if (m !== null && t.value !== null && Number.isFinite(m)) {
				errors.push(Math.abs(m - t.value));
				if (r.verdict !== 'unknown') decided.push(Math.abs(m - t.value));
			}
		}
		return {
			kind,
			unit,
			n: outcomes.length,
			medianError: quantile(errors, 0.5),
			p95Error: quantile(errors, 0.95),
			measuredCount: errors.length,
			p95Decided: quantile(decided, 0.95),
			bounds,
			boundMisses,
			falsePasses,
			falseFails,
			unknowns,
			wrong
		};
	});
}

/** The report as text lines: one row per criterion. */
export function formatScores(scores: CriterionScore[]): string[] {
	const rows = scores.map((s) => [
		s.kind,
		s.unit,
		String(s.measuredCount),
		s.medianError.toFixed(2),
		s.p95Error.toFixed(2),
		Number.isFinite(s.p95Decided) ? s.p95Decided.toFixed(2) : '–',
		s.boundMisses ? `${s.bounds} (${s.boundMisses} missed)` : String(s.bounds),
		String(s.falsePasses),
		`${s.falseFails} (${((100 * s.falseFails) / s.n).toFixed(1)} %)`,
		String(s.unknowns)
	]);
	const head = ['criterion', 'unit', 'measured', 'median err', 'p95 err', 'p95 decided', 'bounds', 'false passes', 'false fails', 'unknowns'];
	const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
	const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i])).join('  ');
	return [line(head), ...rows.map(line)];
}
