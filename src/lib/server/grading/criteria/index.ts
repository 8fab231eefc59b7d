// Dispatches each criterion kind to its evaluator.
import type { CriterionResult, GradeContext } from '../result';
import type { Criterion } from '../spec';
import { gradeAmbientUnder } from './ambient-under';
import { gradeBackgroundCooler } from './background-cooler';
import { gradeBackgroundDrop } from './background-drop';
import { gradeBracket } from './bracket';
import { gradeFlashEvidence } from './flash-evidence';
import { gradeSettingsLimit } from './settings-limits';
import { gradeSubjectLift } from './subject-lift';

export function gradeCriterion(criterion: Criterion, ctx: GradeContext): CriterionResult {
	switch (criterion.kind) {
		case 'ambient-under':
			return gradeAmbientUnder(criterion, ctx);
		case 'subject-lift':
			return gradeSubjectLift(criterion, ctx);
		case 'background-drop':
			return gradeBackgroundDrop(criterion, ctx);
		case 'flash-evidence':
			return gradeFlashEvidence(criterion, ctx);
		case 'background-cooler':
			return gradeBackgroundCooler(criterion, ctx);
		case 'bracket':
			return gradeBracket(criterion, ctx);
		case 'shutter-min':
		case 'shutter-max':
		case 'aperture-range':
		case 'iso-max':
		case 'focal-max':
		case 'focal-min':
			return gradeSettingsLimit(criterion, ctx);
	}
}
