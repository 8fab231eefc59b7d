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

/** One web rendition of a lesson clip, as lesson_clips.renditions holds it: where it is stored and what it is. */
export interface ClipRendition {
	/** file name under the clip's folder, also the last part of its address: `720.mp4`, `360.mp4` */
	file: string;
	type: 'video/mp4';
	width: number;
	height: number;
	bytes: number;
}
