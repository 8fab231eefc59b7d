// Dispatches each criterion kind to its evaluator: one line per kind.
import type { CriterionResult, GradeContext } from '../result';
import type { Criterion, CriterionKind } from '../spec';
import { gradeAmbientUnder } from './ambient-under';
import { gradeBackgroundCooler } from './background-cooler';
import { gradeBackgroundDrop } from './background-drop';
import { gradeBracket } from './bracket';
import { gradeFlashEvidence } from './flash-evidence';
import { gradeFlashShare } from './flash-share';
import { gradeMentorJudged } from './mentor-judged';
import { gradeMotionBlur } from './motion-blur';
import { gradeSettingsLimit } from './settings-limits';
import { gradeSubjectClipping } from './subject-clipping';
import { gradeSubjectLift } from './subject-lift';
import { gradeSync } from './sync';

type Evaluators = { [K in CriterionKind]: (criterion: Extract<Criterion, { kind: K }>, ctx: GradeContext) => CriterionResult };

const EVALUATORS: Evaluators = {
	'ambient-under': gradeAmbientUnder,
	'subject-lift': gradeSubjectLift,
	'background-drop': gradeBackgroundDrop,
	'flash-evidence': gradeFlashEvidence,
	'background-cooler': gradeBackgroundCooler,
	bracket: gradeBracket,
	'shutter-min': gradeSettingsLimit,
	'shutter-max': gradeSettingsLimit,
	'aperture-range': gradeSettingsLimit,
	'iso-max': gradeSettingsLimit,
	'focal-max': gradeSettingsLimit,
	'focal-min': gradeSettingsLimit,
	sync: gradeSync,
	'flash-share': gradeFlashShare,
	'subject-clipping': gradeSubjectClipping,
	'motion-blur': gradeMotionBlur,
	'mentor-judged': gradeMentorJudged
};

export function gradeCriterion(criterion: Criterion, ctx: GradeContext): CriterionResult {
	return (EVALUATORS[criterion.kind] as (c: Criterion, ctx: GradeContext) => CriterionResult)(criterion, ctx);
}
