// Grades an Attempt: every criterion of the Assignment against the frames read from the upload.
import type { Frame } from '../analysis/index';
import { gradeCriterion } from './criteria/index';
import { BLOWN_NOTE_SHARE } from './criteria/evidence';
import { pairOf } from './pair/index';
import type { CriterionResult, CriterionVerdict, FlashUsed, GradeContext } from './result';
import { assignmentSpecSchema, type AssignmentSpec, type AssignmentSpecInput } from './spec';
import { SpecValidationError, toSpecErrors } from './spec-errors';

export type Verdict = 'pass' | 'fail' | 'needs-review';

export interface GradeResult {
	verdict: Verdict;
	criteria: CriterionResult[];
	/** The frames graded, by name, as read (callers store these with the Attempt). */
	frames: Record<string, Frame>;
	/** Things every verdict should say, whatever the criteria (a blown subject, a clipped sky). */
	notes: string[];
}

export interface GradeOptions {
	/** What the learner says they used; gives a predicted subject level beside the measured one. */
	used?: FlashUsed;
}

/**
 * A failed criterion decides: the Attempt is "not yet", and an 'unknown' beside it is left to the mentor's review of
 * the whole. Only when nothing failed does an 'unknown' hand the verdict to a mentor: never a fail the file cannot prove.
 */
export function overallVerdict(verdicts: readonly CriterionVerdict[]): Verdict {
	if (verdicts.includes('fail')) return 'fail';
	return verdicts.includes('unknown') ? 'needs-review' : 'pass';
}

// a frame whose subject box is this much clipped earns a note even where no criterion looks at clipping
const CLIPPED_SUBJECT_NOTE = 0.25;

function verdictNotes(spec: AssignmentSpec, frames: Record<string, Frame>): string[] {
	const notes: string[] = [];
	const names = spec.frames.filter((n) => frames[n]);
	const [refName, litName] = [names[0], names[names.length - 1]];
	if (names.length >= 2) {
		const pair = pairOf(frames[refName], frames[litName]);
		if (pair.ok && pair.pair.blownShare >= BLOWN_NOTE_SHARE) {
			notes.push(`About ${Math.round(100 * pair.pair.blownShare)} % of the flash-lit subject in the “${litName}” frame is blown out (pure white, no detail): turn the flash down or move it back.`);
			return notes;
		}
	}
	for (const name of names) {
		const share = frames[name].pixels?.subject.clippedShare ?? 0;
		if (share >= CLIPPED_SUBJECT_NOTE) notes.push(`About ${Math.round(100 * share)} % of the subject box in the “${name}” frame is clipped to white, so what is there cannot be measured.`);
	}
	return notes;
}

/**
 * Pure and synchronous: frames are read first (readFrame). The spec is checked again here so defaults
 * apply; an invalid spec throws SpecValidationError (specs are validated when authors save them).
 */
export function grade(spec: AssignmentSpec | AssignmentSpecInput, frames: Readonly<Record<string, Frame | undefined>>, options: GradeOptions = {}): GradeResult {
	const parsed = assignmentSpecSchema.safeParse(spec, { reportInput: true });
	if (!parsed.success) throw new SpecValidationError(toSpecErrors(parsed.error));
	const ctx: GradeContext = { spec: parsed.data, frames, used: options.used };
	const criteria = parsed.data.criteria.map((criterion) => gradeCriterion(criterion, ctx));
	const graded: Record<string, Frame> = {};
	for (const name of parsed.data.frames) {
		const frame = frames[name];
		if (frame) graded[name] = frame;
	}
	return { verdict: overallVerdict(criteria.map((c) => c.verdict)), criteria, frames: graded, notes: verdictNotes(parsed.data, graded) };
}
