// Grading an Attempt against an Assignment spec. Server only; no database (callers store the result).
export { grade, overallVerdict, type GradeOptions, type GradeResult, type Verdict } from './grade';
export { describeCriterion } from './describe';
export {
	assignmentSpecSchema,
	criterionSchema,
	CRITERION_KINDS,
	validateSpec,
	parseSpecText,
	resolveFrames,
	type AssignmentSpec,
	type AssignmentSpecInput,
	type Criterion,
	type CriterionInput,
	type CriterionKind,
	type SpecResult
} from './spec';
export { formatSpecErrors, SpecValidationError, type SpecError } from './spec-errors';
export type { CriterionResult, CriterionVerdict, Comparison, Evidence, FlashUsed, Unit } from './result';
export { CRITERION_HELP } from './help';
export { DEFAULT_SYNC_SPEED } from './spec';
export { RUBRIC_ITEMS, DEFAULT_RUBRIC_BY_KIND, rubricFor, rubricItem, cleanRubric, type RubricItem, type RubricId } from './rubric';
