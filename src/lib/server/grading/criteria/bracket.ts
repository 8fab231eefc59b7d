// bracket: each frame's exposure relative to the first, from its settings, against the offsets asked for.
import { ev100 } from '../../../exposure/index';
import { formatAmount, formatOffset } from '../format';
import { capitalise, frameWords, isResult, lookupFrame, requireExif, type CriterionResult, type GradeContext } from '../result';
import type { Criterion } from '../spec';

type Bracket = Extract<Criterion, { kind: 'bracket' }>;

export function gradeBracket(c: Bracket, ctx: GradeContext): CriterionResult {
	const names = c.frames ?? ctx.spec.frames;
	const base = { kind: c.kind, target: c.offsets, tolerance: c.tolerance, unit: 'EV' as const, comparison: 'within' as const, frames: names };
	const evs: number[] = [];
	for (const name of names) {
		const frame = lookupFrame(ctx, name, base);
		if (isResult(frame)) return frame;
		const exif = requireExif(frame, name, ['exposureTime', 'fNumber', 'iso'], base);
		if (isResult(exif)) return exif;
		evs.push(ev100({ aperture: exif.fNumber, shutter: exif.exposureTime, iso: exif.iso }));
	}
	// +1 means one stop more light than the first frame, i.e. an EV100 one lower
	const measured = evs.map((ev) => evs[0] - ev);
	const wrong = names
		.map((name, i) => ({ name, got: measured[i], want: c.offsets[i] }))
		.filter(({ got, want }) => Math.abs(got - want) > c.tolerance);
	const list = names.map((n, i) => `${n} ${formatOffset(Math.round(measured[i] * 3) / 3)}`).join(', ');
	if (wrong.length === 0) {
		return { ...base, verdict: 'pass', measured, missing: [], message: `Your bracket steps are ${list} EV, as asked (± ${formatAmount(c.tolerance)}).` };
	}
	const fixes = wrong.map(
		({ name, got, want }) =>
			`${frameWords(name)} is ${formatOffset(Math.round(got * 10) / 10)} EV from the first and should be ${formatOffset(want)} ± ${formatAmount(c.tolerance)}`
	);
	return {
		...base,
		verdict: 'fail',
		measured,
		missing: [],
		message: `Your bracket steps are ${list} EV. ${capitalise(fixes.join('; '))}. Change one setting at a time: one stop is double or half the shutter time.`
	};
}
