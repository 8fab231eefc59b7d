// The shapes the jsonb columns hold, typed once beside the schema so reads need no casts.
import type { Frame } from '../analysis/index';
import type { AssignmentSpecInput, CriterionResult } from '../grading/index';

export type { SubjectBox } from '../../attempts/box';
export type { PlanLayout } from '../../attempts/light-plan';
export type { AssignmentSpecInput };

/** What attempt_frames.analysis holds: the frame as read, or why it could not be read. */
export type StoredAnalysis = { ok: true; frame: Frame } | { ok: false; message: string };

/** What attempts.result holds. */
export interface StoredResult {
	criteria: CriterionResult[];
}
