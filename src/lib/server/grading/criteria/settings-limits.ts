// Limits on one frame's settings: shutter-min, shutter-max, aperture-range, iso-max, focal-max, focal-min.
import { equivalentExposures, ev100, formatAperture, formatShutter } from '../../../exposure/index';
import { formatMm } from '../format';
import { isResult, lookupFrame, requireExif, type CriterionResult, type GradeContext, type ResultBase } from '../result';
import { resolveFrames, type Criterion } from '../spec';
import type { Frame } from '../../analysis/index';

type Limit = Extract<Criterion, { kind: 'shutter-min' | 'shutter-max' | 'aperture-range' | 'iso-max' | 'focal-max' | 'focal-min' }>;

// Exif stores a marked value by its name (1/125 s, f/5.6) while another camera may store the exact power of two
// (1/128 s, f/5.66): a sixth of a stop of slack keeps both on the right side. common practice, no published source
const SLACK = 2 ** (1 / 6);

interface Check {
	base: ResultBase;
	frame: Frame;
	name: string;
}

function start(c: Limit, ctx: GradeContext, base: Omit<ResultBase, 'kind' | 'frames'>): Check | CriterionResult {
	const { frame: name } = resolveFrames(c, ctx.spec);
	const full: ResultBase = { ...base, kind: c.kind, frames: [name] };
	const frame = lookupFrame(ctx, name, full);
	return isResult(frame) ? frame : { base: full, frame, name };
}

/** Same exposure at a marked shutter on the allowed side of `limit`, as advice ("1/1000 s at f/5.6"). */
function equivalentAt(frame: Frame, limit: number, faster: boolean): string | null {
	const { exposureTime, fNumber, iso } = frame.exif;
	if (exposureTime === null || fNumber === null || iso === null) return null;
	const ev = ev100({ aperture: fNumber, shutter: exposureTime, iso });
	const rows = equivalentExposures(ev, { iso, shutterRange: faster ? { max: limit * SLACK } : { min: limit / SLACK } })
		.filter((r) => (faster ? r.shutter <= limit * SLACK : r.shutter >= limit / SLACK))
		.sort((a, b) => (faster ? b.shutter - a.shutter : a.shutter - b.shutter));
	const best = rows[0];
	return best ? `For the same exposure at ISO ${Math.round(iso)}, try ${best.shutterLabel} s at ${best.apertureLabel}.` : null;
}

function gradeShutter(c: Extract<Limit, { kind: 'shutter-min' | 'shutter-max' }>, ctx: GradeContext): CriterionResult {
	const faster = c.kind === 'shutter-min';
	const begun = start(c, ctx, { target: c.seconds, tolerance: null, unit: 's', comparison: faster ? 'at-most' : 'at-least' });
	if (isResult(begun)) return begun;
	const exif = requireExif(begun.frame, begun.name, ['exposureTime'], begun.base);
	if (isResult(exif)) return exif;
	const t = exif.exposureTime;
	const ok = faster ? t <= c.seconds * SLACK : t >= c.seconds / SLACK;
	const want = `${formatShutter(c.seconds)} s or ${faster ? 'faster' : 'slower'}`;
	const found = `Your shutter was ${formatShutter(t)} s; the assignment asks for ${want}.`;
	if (ok) return { ...begun.base, verdict: 'pass', measured: t, missing: [], message: found };
	const why = faster ? 'A shorter exposure freezes the action and darkens the ambient.' : 'A longer exposure lets the ambient record movement.';
	const advice = equivalentAt(begun.frame, c.seconds, faster);
	return { ...begun.base, verdict: 'fail', measured: t, missing: [], message: [found, why, advice].filter(Boolean).join(' ') };
}

function gradeAperture(c: Extract<Limit, { kind: 'aperture-range' }>, ctx: GradeContext): CriterionResult {
	const target = c.min !== undefined && c.max !== undefined ? [c.min, c.max] : (c.min ?? c.max ?? null);
	const comparison = c.min !== undefined && c.max !== undefined ? 'between' : c.min !== undefined ? 'at-least' : 'at-most';
	const begun = start(c, ctx, { target, tolerance: null, unit: 'f-number', comparison });
	if (isResult(begun)) return begun;
	const exif = requireExif(begun.frame, begun.name, ['fNumber'], begun.base);
	if (isResult(exif)) return exif;
	const n = exif.fNumber;
	// one stop of aperture is a factor √2 in N, so the sixth-stop slack is its square root in N
	const slack = Math.sqrt(SLACK);
	const tooWide = c.min !== undefined && n < c.min / slack;
	const tooNarrow = c.max !== undefined && n > c.max * slack;
	const range =
		c.min !== undefined && c.max !== undefined
			? `between ${formatAperture(c.min)} and ${formatAperture(c.max)}`
			: c.min !== undefined
				? `${formatAperture(c.min)} or narrower`
				: `${formatAperture(c.max as number)} or wider`;
	const found = `Your aperture was ${formatAperture(n)}; the assignment asks for ${range}.`;
	if (!tooWide && !tooNarrow) return { ...begun.base, verdict: 'pass', measured: n, missing: [], message: found };
	const fix = tooWide ? 'Stop down (a larger f-number) and keep the exposure with a longer shutter or more ISO.' : 'Open up (a smaller f-number) and keep the exposure with a shorter shutter or less ISO.';
	return { ...begun.base, verdict: 'fail', measured: n, missing: [], message: `${found} ${fix}` };
}

function gradeIso(c: Extract<Limit, { kind: 'iso-max' }>, ctx: GradeContext): CriterionResult {
	const begun = start(c, ctx, { target: c.iso, tolerance: null, unit: 'ISO', comparison: 'at-most' });
	if (isResult(begun)) return begun;
	const exif = requireExif(begun.frame, begun.name, ['iso'], begun.base);
	if (isResult(exif)) return exif;
	const found = `Your ISO was ${Math.round(exif.iso)}; the assignment asks for ISO ${Math.round(c.iso)} or lower.`;
	if (exif.iso <= c.iso * SLACK) return { ...begun.base, verdict: 'pass', measured: exif.iso, missing: [], message: found };
	return {
		...begun.base,
		verdict: 'fail',
		measured: exif.iso,
		missing: [],
		message: `${found} Lower the ISO and give the flash more power or bring it closer to keep the subject bright.`
	};
}

function gradeFocal(c: Extract<Limit, { kind: 'focal-max' | 'focal-min' }>, ctx: GradeContext): CriterionResult {
	const atMost = c.kind === 'focal-max';
	const begun = start(c, ctx, { target: c.mm35, tolerance: null, unit: 'mm', comparison: atMost ? 'at-most' : 'at-least' });
	if (isResult(begun)) return begun;
	const exif = requireExif(begun.frame, begun.name, ['focal35'], begun.base);
	if (isResult(exif)) return exif;
	const f = exif.focal35;
	// Exif stores whole millimetres here; half a millimetre covers rounding
	const ok = atMost ? f <= c.mm35 + 0.5 : f >= c.mm35 - 0.5;
	const found = `Your lens was at ${formatMm(f)} (35 mm equivalent); the assignment asks for ${formatMm(c.mm35)} or ${atMost ? 'wider' : 'longer'}.`;
	if (ok) return { ...begun.base, verdict: 'pass', measured: f, missing: [], message: found };
	const fix = atMost ? 'Zoom out or change to a wider lens, and work closer only where it is safe: stay out of the athlete’s line and follow the venue’s rules.' : 'Zoom in or change to a longer lens and step back.';
	return { ...begun.base, verdict: 'fail', measured: f, missing: [], message: `${found} ${fix}` };
}

export function gradeSettingsLimit(c: Limit, ctx: GradeContext): CriterionResult {
	switch (c.kind) {
		case 'shutter-min':
		case 'shutter-max':
			return gradeShutter(c, ctx);
		case 'aperture-range':
			return gradeAperture(c, ctx);
		case 'iso-max':
			return gradeIso(c, ctx);
		case 'focal-max':
		case 'focal-min':
			return gradeFocal(c, ctx);
	}
}
