// Grades an Attempt: every criterion of the Assignment against the frames read from the upload.
import type { Frame } from '../analysis/index';
import { gradeCriterion } from './criteria/index';
import type { CriterionResult, CriterionVerdict, GradeContext } from './result';
import { assignmentSpecSchema, type AssignmentSpec, type AssignmentSpecInput } from './spec';
import { SpecValidationError, toSpecErrors } from './spec-errors';

export type Verdict = 'pass' | 'fail' | 'needs-review';

export interface GradeResult {
	verdict: Verdict;
	criteria: CriterionResult[];
	/** The frames graded, by name, as read (callers store these with the Attempt). */
	frames: Record<string, Frame>;
}

/** Any 'unknown' hands the Attempt to a mentor, even beside a fail: the mentor sees the whole picture. */
export function overallVerdict(verdicts: readonly CriterionVerdict[]): Verdict {
	if (verdicts.includes('unknown')) return 'needs-review';
	return verdicts.includes('fail') ? 'fail' : 'pass';
}

/**
 * Pure and synchronous: frames are read first (readFrame). The spec is checked again here so defaults
 * apply; an invalid spec throws SpecValidationError (specs are validated when authors save them).
 */
export function grade(spec: AssignmentSpec | AssignmentSpecInput, frames: Readonly<Record<string, Frame | undefined>>): GradeResult {
	const parsed = assignmentSpecSchema.safeParse(spec, { reportInput: true });
	if (!parsed.success) throw new SpecValidationError(toSpecErrors(parsed.error));
	const ctx: GradeContext = { spec: parsed.data, frames };
	const criteria = parsed.data.criteria.map((criterion) => gradeCriterion(criterion, ctx));
	const graded: Record<string, Frame> = {};
	for (const name of parsed.data.frames) {
		const frame = frames[name];
		if (frame) graded[name] = frame;
	}
	return { verdict: overallVerdict(criteria.map((c) => c.verdict)), criteria, frames: graded };
}
