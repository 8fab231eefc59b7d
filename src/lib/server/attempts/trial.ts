// Trying an Assignment spec on sample frames: read and grade them exactly as an Attempt would be, store nothing.
import type { CriterionView } from '$lib/attempts/criterion-view';
import { DEFAULT_SUBJECT_BOX, tryReadFrame, type Box, type Frame } from '../analysis/index';
import { describeCriterion, grade, parseSpecText, type SpecError } from '../grading/index';
import { formatMeasured, formatTargetOf } from './format-result';
import { maxUploadBytes } from './limits';

/** A criterion of a trial verdict: the verdict page's shape without the pixel evidence. */
export type TrialCriterion = Omit<CriterionView, 'evidence'>;

export type TrialOutcome =
	| { ok: true; verdict: 'pass' | 'fail' | 'needs-review'; criteria: TrialCriterion[]; frames: { name: string; problem: string | null; notes: string[] }[] }
	| { ok: false; status: 400 | 413; message: string; specErrors?: SpecError[] };

/**
 * Grades the frames against the spec text with the same reader and grader the queue uses. A frame the spec lists
 * but the author left out is graded as missing (its criteria hand over to a mentor), as for a learner.
 */
export async function trySpec(specText: string, files: Record<string, File | undefined>, subject: Box = DEFAULT_SUBJECT_BOX): Promise<TrialOutcome> {
	const checked = parseSpecText(specText);
	if (!checked.ok) return { ok: false, status: 400, message: 'Fix the spec first: it has problems.', specErrors: checked.errors };
	const spec = checked.spec;
	const limit = maxUploadBytes();
	const frames: Record<string, Frame> = {};
	const report: { name: string; problem: string | null; notes: string[] }[] = [];
	for (const name of spec.frames) {
		const file = files[name];
		if (!file || file.size === 0) {
			report.push({ name, problem: 'Not uploaded: criteria that need it will say so.', notes: [] });
			continue;
		}
		if (file.size > limit) return { ok: false, status: 413, message: `The “${name}” file is over ${Math.round(limit / 1024 / 1024)} MB.` };
		const bytes = new Uint8Array(await file.arrayBuffer());
		const read = await tryReadFrame(bytes, { subject, limits: { maxBytes: limit } });
		if (read.ok) {
			frames[name] = read.frame;
			report.push({ name, problem: null, notes: read.frame.notes });
		} else report.push({ name, problem: read.error.message, notes: [] });
	}
	const result = grade(spec, frames);
	return {
		ok: true,
		verdict: result.verdict,
		criteria: result.criteria.map((r, i) => ({
			kind: r.kind,
			verdict: r.verdict,
			asked: describeCriterion(spec.criteria[i]),
			measured: formatMeasured(r),
			target: formatTargetOf(r),
			message: r.message
		})),
		frames: report
	};
}
