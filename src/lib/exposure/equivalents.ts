// Lists marked aperture/shutter pairs that give a wanted EV at a fixed ISO (the Stop Ladder's rows).
import { ev100 as evOf, shutterFor } from './apex';
import { ExposureInputError, requireFinite, requirePositive } from './errors';
import { formatAperture } from './format';
import { markedSeries, nearestMarked, resolveStep, STOP_STEPS } from './series';

/** One equivalent setting: f-number, shutter (s), its marked names, ISO, the EV100 it really gives and its error in stops. */
export interface EquivalentExposure {
	aperture: number;
	apertureLabel: string;
	shutter: number;
	shutterLabel: string;
	iso: number;
	ev100: number;
	/** Actual minus wanted EV, in stops (positive = this setting is slightly darker than asked). */
	offStops: number;
}

/** Options: ISO, f-numbers to try (default full-stop marks f/1–f/64), shutter limits in seconds, shutter step in stops. */
export interface EquivalentOptions {
	iso: number;
	apertures?: readonly number[];
	shutterRange?: { min?: number; max?: number };
	shutterStep?: number;
}

// Marked speeds sit up to ~0.1 stop off their names (1/8000 is 2^-13 = 1/8192), so limits get that much slack.
const RANGE_SLACK = 2 ** (1 / 6);

/** Marked settings giving `ev100` (EV at ISO 100) at the given ISO, one per aperture whose shutter fits the range. */
export function equivalentExposures(ev100: number, options: EquivalentOptions): EquivalentExposure[] {
	const target = requireFinite('ev100', ev100);
	if (options === null || typeof options !== 'object') {
		throw new ExposureInputError('options must be an object with at least { iso }');
	}
	const iso = requirePositive('iso', options.iso);
	const step = options.shutterStep ?? STOP_STEPS.third;
	const stepSize = STOP_STEPS[resolveStep(step)];
	const apertures = options.apertures ?? markedSeries('aperture', STOP_STEPS.full).map((m) => m.value);
	const min = requirePositive('shutterRange.min', options.shutterRange?.min ?? 1 / 8000, 's');
	const max = requirePositive('shutterRange.max', options.shutterRange?.max ?? 30, 's');
	if (min > max) throw new ExposureInputError(`shutterRange.min (${min} s) is longer than shutterRange.max (${max} s)`);

	const rows: EquivalentExposure[] = [];
	for (const raw of apertures) {
		const aperture = requirePositive('aperture', raw, '(f-number)');
		const exact = shutterFor({ ev100: target, aperture, iso });
		const mark = nearestMarked(exact, 'shutter', step);
		// Beyond the ends of the series the nearest mark is too far off to count as equivalent.
		if (Math.abs(Math.log2(mark.value / exact)) > stepSize / 2 + 1e-9) continue;
		if (mark.value < min / RANGE_SLACK || mark.value > max * RANGE_SLACK) continue;
		const actual = evOf({ aperture, shutter: mark.value, iso });
		rows.push({
			aperture,
			apertureLabel: formatAperture(aperture),
			shutter: mark.value,
			shutterLabel: mark.label,
			iso,
			ev100: actual,
			offStops: actual - target
		});
	}
	return rows.sort((a, b) => a.aperture - b.aperture);
}
