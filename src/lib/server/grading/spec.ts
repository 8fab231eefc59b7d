// The Assignment spec: its zod schema, defaults, and validation errors located by path and written for authors.
// Pure zod, no server imports: the browser editor can use the same schema.
import { z } from 'zod';
import { RUBRIC_IDS } from './rubric';
import { toSpecErrors, type SpecError } from './spec-errors';

const frameName = z
	.string()
	.regex(/^[A-Za-z0-9][A-Za-z0-9 _-]{0,39}$/, 'must be 1–40 letters, digits, spaces, _ or -, starting with a letter or digit');

const stops = (max: number) => z.number().min(-max).max(max);
const positiveStops = (max: number) => z.number().min(0).max(max);
const seconds = z.number().positive().max(3600);
// one third of a stop, written 0.34 in specs so a measured ⅓ stop lands inside
const THIRD = 0.34;

/** The frame graded (default: the last frame listed) and, where it compares, the reference (default: the first). */
const graded = { frame: frameName.optional() };
const compared = { frame: frameName.optional(), reference: frameName.optional() };

export const ambientUnderSchema = z
	.object({
		kind: z.literal('ambient-under'),
		stops: positiveStops(6),
		tolerance: positiveStops(3).default(THIRD),
		/** Scene EV100 to compare with when the Assignment has no ambient reference frame. */
		sceneEv: stops(25).optional(),
		...compared
	})
	.strict();

/** The flash's lift on the subject, against the same subject in the ambient reference frame. */
export const subjectLiftSchema = z.object({ kind: z.literal('subject-lift'), minStops: stops(10), ...compared }).strict();

export const backgroundDropSchema = z
	.object({ kind: z.literal('background-drop'), tolerance: positiveStops(3).default(0.5), ...compared })
	.strict();

/** Shutter speed at least this fast: exposure time at most `seconds` (a minimum shutter speed, as on camera menus). */
export const shutterMinSchema = z.object({ kind: z.literal('shutter-min'), seconds, ...graded }).strict();
/** Shutter speed at most this fast: exposure time at least `seconds` (e.g. dragging the shutter). */
export const shutterMaxSchema = z.object({ kind: z.literal('shutter-max'), seconds, ...graded }).strict();

export const apertureRangeSchema = z
	.object({ kind: z.literal('aperture-range'), min: z.number().min(0.5).max(128).optional(), max: z.number().min(0.5).max(128).optional(), ...graded })
	.strict();

export const isoMaxSchema = z.object({ kind: z.literal('iso-max'), iso: z.number().positive().max(10_000_000), ...graded }).strict();
export const focalMaxSchema = z.object({ kind: z.literal('focal-max'), mm35: z.number().positive().max(5000), ...graded }).strict();
export const focalMinSchema = z.object({ kind: z.literal('focal-min'), mm35: z.number().positive().max(5000), ...graded }).strict();

export const flashEvidenceSchema = z
	.object({
		kind: z.literal('flash-evidence'),
		/** Subject lift beyond what the ambient explains that counts as pixel evidence of flash, in stops. */
		minLiftStops: positiveStops(5).default(0.5),
		...compared
	})
	.strict();

export const backgroundCoolerSchema = z
	.object({ kind: z.literal('background-cooler'), minMired: z.number().min(0).max(1000), ...compared })
	.strict();

/** Default camera sync speed when neither the criterion nor the spec gives one. common practice, no published source */
export const DEFAULT_SYNC_SPEED = 1 / 250;

/** Shutter at or below the camera's sync speed, unless the assignment is a high-speed-sync one. */
export const syncSchema = z
	.object({
		kind: z.literal('sync'),
		/** The camera's sync speed in seconds (default: the spec's syncSpeed, else 1/250 s). */
		syncSpeed: seconds.optional(),
		/** High-speed sync allowed: shutters above sync pass, and the verdict states the flash power they cost. */
		highSpeedSync: z.boolean().default(false),
		...graded
	})
	.strict();

/** The flash's share of the subject's exposure (or the flash:ambient ratio in stops), measured from the pair. */
export const flashShareSchema = z
	.object({
		kind: z.literal('flash-share'),
		/** Share of the subject's light that comes from the flash, 0.02–0.98 (0.5 = flash and ambient equal). */
		share: z.number().min(0.02).max(0.98).optional(),
		/** Or: flash over ambient on the subject in stops (0 = equal, +1 = flash twice the ambient). */
		ratioStops: stops(6).optional(),
		/** ± stops of the flash:ambient ratio. */
		tolerance: positiveStops(3).default(0.5),
		...compared
	})
	.strict();

/** At most this share of the flash-lit subject blown out (clipped). */
export const subjectClippingSchema = z
	.object({ kind: z.literal('subject-clipping'), maxPercent: z.number().min(0).max(100).default(10), ...compared })
	.strict();

export const bracketSchema = z
	.object({
		kind: z.literal('bracket'),
		/** Exposure of each frame relative to the first, in EV (+1 = one stop more light); the first is 0. */
		offsets: z.array(stops(10)).min(2).max(12),
		tolerance: positiveStops(3).default(THIRD),
		/** Frames in bracket order (default: all frames of the Assignment, in order). */
		frames: z.array(frameName).min(2).max(12).optional()
	})
	.strict();

/** Blur of a moving subject in pixels, from the frame's Exif shutter and 35 mm equivalent focal length: at most `maxPx`. */
export const motionBlurSchema = z
	.object({
		kind: z.literal('motion-blur'),
		maxPx: z.number().positive().max(1000),
		/** Subject speed across the frame, m/s; the learner may state their own on the upload form. */
		speed: z.number().positive().max(100),
		/** Camera to subject, metres; the learner may state their own on the upload form. */
		distance: z.number().positive().max(1000),
		/** Set on an Attempt's copy of the spec when speed and distance are the ones the learner stated. */
		stated: z.boolean().optional(),
		...graded
	})
	.strict();

/** What only a person can judge in the picture (a light pattern on a face): handed to a mentor, with what to look for. */
export const mentorJudgedSchema = z.object({ kind: z.literal('mentor-judged'), look: z.string().trim().min(1).max(400), ...graded }).strict();

// One line per criterion kind: add its schema here, its evaluator in criteria/index.ts, its words in describe.ts.
const CRITERION_SCHEMAS = [
	ambientUnderSchema,
	subjectLiftSchema,
	backgroundDropSchema,
	shutterMinSchema,
	shutterMaxSchema,
	apertureRangeSchema,
	isoMaxSchema,
	focalMaxSchema,
	focalMinSchema,
	flashEvidenceSchema,
	backgroundCoolerSchema,
	bracketSchema,
	syncSchema,
	flashShareSchema,
	subjectClippingSchema,
	motionBlurSchema,
	mentorJudgedSchema
] as const;

export const criterionSchema = z.discriminatedUnion('kind', CRITERION_SCHEMAS);

export const CRITERION_KINDS = criterionSchema.options.map((o) => o.shape.kind.value);

export type Criterion = z.output<typeof criterionSchema>;
export type CriterionInput = z.input<typeof criterionSchema>;
export type CriterionKind = Criterion['kind'];

function checkReferences(spec: { frames: string[]; sceneEv?: number; syncSpeed?: number; criteria: Criterion[]; rubric?: string[] }, ctx: z.RefinementCtx): void {
	const known = new Set(spec.frames);
	const seen = new Set<string>();
	spec.rubric?.forEach((id, i) => {
		if (spec.rubric!.indexOf(id) !== i) ctx.addIssue({ code: 'custom', path: ['rubric', i], message: `lists "${id}" twice` });
	});
	spec.frames.forEach((name, i) => {
		if (seen.has(name)) ctx.addIssue({ code: 'custom', path: ['frames', i], message: `lists "${name}" twice` });
		seen.add(name);
	});
	const mustExist = (name: string | undefined, path: (string | number)[]) => {
		if (name !== undefined && !known.has(name)) {
			ctx.addIssue({ code: 'custom', path, message: `names a frame "${name}" that is not in frames (${spec.frames.join(', ')})` });
		}
	};
	spec.criteria.forEach((c, i) => {
		const at = (...rest: (string | number)[]) => ['criteria', i, ...rest];
		if (c.kind === 'bracket') {
			c.frames?.forEach((f, j) => mustExist(f, at('frames', j)));
			const count = (c.frames ?? spec.frames).length;
			if (c.offsets.length !== count) ctx.addIssue({ code: 'custom', path: at('offsets'), message: `needs one offset per bracketed frame (${count}), got ${c.offsets.length}` });
			else if (c.offsets[0] !== 0) ctx.addIssue({ code: 'custom', path: at('offsets', 0), message: 'must be 0: offsets are measured from the first frame' });
			return;
		}
		mustExist(c.frame, at('frame'));
		KIND_CHECKS[c.kind]?.(c as never, { spec, at, add: (path, message) => ctx.addIssue({ code: 'custom', path, message }) });
		if (!('reference' in criterionShape(c.kind))) return;
		if ('reference' in c) mustExist(c.reference, at('reference'));
		const { frame, reference } = resolveFrames(c, spec);
		if (reference !== null && reference === frame) {
			ctx.addIssue({ code: 'custom', path: at('reference'), message: `must be a different frame from the graded one ("${frame}")` });
		}
		if (c.kind === 'background-drop' && reference === null) {
			ctx.addIssue({ code: 'custom', path: at(), message: 'compares two frames: list a reference and a lit frame in frames' });
		}
		if (c.kind === 'ambient-under' && reference === null && c.sceneEv === undefined && spec.sceneEv === undefined) {
			ctx.addIssue({ code: 'custom', path: at(), message: 'needs an ambient reference frame, or a sceneEv to compare with' });
		}
	});
}

function criterionShape(kind: CriterionKind): Record<string, unknown> {
	return CRITERION_SCHEMAS.find((s) => s.shape.kind.value === kind)?.shape ?? {};
}

interface CheckTools {
	spec: { frames: string[] };
	at: (...rest: (string | number)[]) => (string | number)[];
	add: (path: (string | number)[], message: string) => void;
}

// Checks of one kind's fields that zod's shape alone cannot say.
const KIND_CHECKS: { [K in CriterionKind]?: (c: Extract<Criterion, { kind: K }>, t: CheckTools) => void } = {
	'aperture-range': (c, { at, add }) => {
		if (c.min === undefined && c.max === undefined) add(at(), 'needs min, max or both');
		if (c.min !== undefined && c.max !== undefined && c.min > c.max) add(at('min'), `must not be above max (f/${c.max})`);
	},
	'flash-share': (c, { at, add }) => {
		if ((c.share === undefined) === (c.ratioStops === undefined)) add(at(), 'needs either share (0.02–0.98) or ratioStops, not both');
	}
};

export const assignmentSpecSchema = z
	.object({
		title: z.string().max(200).optional(),
		frames: z.array(frameName).min(1).max(12),
		/** Scene EV100 for ambient-under when no reference frame is shot. */
		sceneEv: stops(25).optional(),
		/** The camera's flash sync speed in seconds, for sync and for advice (default 1/250 s). */
		syncSpeed: seconds.optional(),
		/** The upload must carry a Light Plan with at least this many lights (for a mentor judging light placement). */
		lightPlan: z.object({ minLights: z.number().int().min(1).max(3) }).strict().optional(),
		/** Uploads open only after a mentor approves the learner's Shoot Plan (Light Plan, settings, safety checklist). */
		shootPlan: z
			.object({ checklist: z.array(z.string().trim().min(3).max(300)).min(1).max(12).optional() })
			.strict()
			.optional(),
		criteria: z.array(criterionSchema).min(1).max(40),
		/** What the mentor scores (rubric item ids); without it, defaults follow the kinds of criteria. */
		rubric: z.array(z.enum(RUBRIC_IDS)).min(1).max(RUBRIC_IDS.length).optional()
	})
	.strict()
	.superRefine(checkReferences);

export type AssignmentSpec = z.output<typeof assignmentSpecSchema>;
export type AssignmentSpecInput = z.input<typeof assignmentSpecSchema>;

/** The graded frame and the reference a criterion uses, after defaults (reference null when there is none). */
export function resolveFrames(
	criterion: Exclude<Criterion, { kind: 'bracket' }>,
	spec: { frames: string[] }
): { frame: string; reference: string | null } {
	const frame = criterion.frame ?? spec.frames[spec.frames.length - 1];
	const explicit = 'reference' in criterion ? criterion.reference : undefined;
	const fallback = spec.frames.length >= 2 && spec.frames[0] !== frame ? spec.frames[0] : null;
	return { frame, reference: explicit ?? fallback };
}

export type SpecResult = { ok: true; spec: AssignmentSpec } | { ok: false; errors: SpecError[] };

/** Validates a spec object; errors say where ('criteria[1].stops') and what is wrong. */
export function validateSpec(input: unknown): SpecResult {
	const parsed = assignmentSpecSchema.safeParse(input, { reportInput: true });
	return parsed.success ? { ok: true, spec: parsed.data } : { ok: false, errors: toSpecErrors(parsed.error) };
}

/** Validates spec text as an author typed or uploaded it, including JSON syntax errors. */
export function parseSpecText(text: string): SpecResult {
	let input: unknown;
	try {
		input = JSON.parse(text);
	} catch (error) {
		const detail = error instanceof Error ? error.message : String(error);
		return { ok: false, errors: [{ path: '', message: `is not valid JSON (${detail})` }] };
	}
	return validateSpec(input);
}
