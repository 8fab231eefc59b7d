// Nominal marked series of apertures, shutter times and ISO speeds in full, half and third stops.
import { ExposureInputError, requirePositive } from './errors';

/** Which control a marked series belongs to. */
export type SeriesKind = 'aperture' | 'shutter' | 'iso';

/** One mark: `value` is the exact theoretical value (f-number, seconds or ISO), `label` the rounded name printed on cameras. */
export interface MarkedValue {
	value: number;
	label: string;
}

/** Allowed step sizes between marks, in stops. */
export const STOP_STEPS = { full: 1, half: 1 / 2, third: 1 / 3 } as const;

// Conventional names as printed on lenses, dials and camera menus (common practice, no published source; from memory).
// Each list starts at the series' first mark and advances one step per entry.
const APERTURE_THIRDS = [
	'1', '1.1', '1.2', '1.4', '1.6', '1.8', '2', '2.2', '2.5', '2.8', '3.2', '3.5', '4', '4.5', '5', '5.6', '6.3', '7.1',
	'8', '9', '10', '11', '13', '14', '16', '18', '20', '22', '25', '29', '32', '36', '40', '45', '51', '57', '64'
];
const APERTURE_HALVES = [
	'1', '1.2', '1.4', '1.7', '2', '2.4', '2.8', '3.3', '4', '4.8', '5.6', '6.7', '8', '9.5', '11', '13', '16', '19', '22',
	'27', '32', '38', '45', '54', '64'
];
const SHUTTER_THIRDS = [
	'30"', '25"', '20"', '15"', '13"', '10"', '8"', '6"', '5"', '4"', '3.2"', '2.5"', '2"', '1.6"', '1.3"', '1"', '0.8"',
	'0.6"', '0.5"', '0.4"', '0.3"', '1/4', '1/5', '1/6', '1/8', '1/10', '1/13', '1/15', '1/20', '1/25', '1/30', '1/40',
	'1/50', '1/60', '1/80', '1/100', '1/125', '1/160', '1/200', '1/250', '1/320', '1/400', '1/500', '1/640', '1/800',
	'1/1000', '1/1250', '1/1600', '1/2000', '1/2500', '1/3200', '1/4000', '1/5000', '1/6400', '1/8000', '1/10000',
	'1/13000', '1/16000', '1/20000', '1/25000', '1/32000'
];
const SHUTTER_HALVES = [
	'30"', '20"', '15"', '10"', '8"', '6"', '4"', '3"', '2"', '1.5"', '1"', '0.7"', '0.5"', '0.3"', '1/4', '1/6', '1/8',
	'1/10', '1/15', '1/20', '1/30', '1/45', '1/60', '1/90', '1/125', '1/180', '1/250', '1/350', '1/500', '1/750',
	'1/1000', '1/1500', '1/2000', '1/3000', '1/4000', '1/6000', '1/8000', '1/12000', '1/16000', '1/24000', '1/32000'
];
const ISO_THIRDS = [
	'25', '32', '40', '50', '64', '80', '100', '125', '160', '200', '250', '320', '400', '500', '640', '800', '1000',
	'1250', '1600', '2000', '2500', '3200', '4000', '5000', '6400', '8000', '10000', '12800', '16000', '20000', '25600',
	'32000', '40000', '51200', '64000', '80000', '102400'
];
const ISO_HALVES = [
	'25', '35', '50', '70', '100', '140', '200', '280', '400', '560', '800', '1100', '1600', '2200', '3200', '4500',
	'6400', '9000', '12800', '18000', '25600', '36000', '51200', '72000', '102400'
];

interface SeriesSpec {
	/** Light stops of the first mark relative to the reference (f/1, 1 s, ISO 100). */
	firstStops: number;
	/** Exact value at a given number of stops from the reference. */
	valueAt: (stops: number) => number;
	format: (raw: string) => string;
	thirds: readonly string[];
	halves: readonly string[];
}

const SPECS: Record<SeriesKind, SeriesSpec> = {
	// Each stop multiplies the f-number by √2: f/5.6 is 2^(5/2).
	aperture: { firstStops: 0, valueAt: (s) => 2 ** (s / 2), format: (raw) => `f/${raw}`, thirds: APERTURE_THIRDS, halves: APERTURE_HALVES },
	// Shutter stops count towards shorter times: '1/250' is 2^-8 = 1/256 s.
	shutter: { firstStops: -5, valueAt: (s) => 2 ** -s, format: (raw) => raw, thirds: SHUTTER_THIRDS, halves: SHUTTER_HALVES },
	iso: { firstStops: -2, valueAt: (s) => 100 * 2 ** s, format: (raw) => raw, thirds: ISO_THIRDS, halves: ISO_HALVES }
};

/** Returns the step name for 1, 1/2 or 1/3 stop; throws on anything else. */
export function resolveStep(step: number): keyof typeof STOP_STEPS {
	for (const [name, size] of Object.entries(STOP_STEPS)) {
		if (Math.abs(step - size) < 1e-9) return name as keyof typeof STOP_STEPS;
	}
	throw new ExposureInputError(`step must be 1, 1/2 or 1/3 stop, got ${String(step)}`);
}

const cache = new Map<string, readonly MarkedValue[]>();

/** The marked series for a control at a step of 1, 1/2 or 1/3 stop, from f/1, 30 s and ISO 25 upwards in steps. */
export function markedSeries(kind: SeriesKind, step: number = STOP_STEPS.third): readonly MarkedValue[] {
	const spec = SPECS[kind];
	if (!spec) throw new ExposureInputError(`kind must be 'aperture', 'shutter' or 'iso', got ${String(kind)}`);
	const stepName = resolveStep(step);
	const key = `${kind}:${stepName}`;
	const hit = cache.get(key);
	if (hit) return hit;
	// Full stops are every third third-stop mark; halves have their own names.
	const raw = stepName === 'half' ? spec.halves : spec.thirds;
	const size = stepName === 'half' ? 1 / 2 : 1 / 3;
	const every = stepName === 'full' ? 3 : 1;
	const marks: MarkedValue[] = [];
	for (let i = 0; i < raw.length; i += every) {
		marks.push(Object.freeze({ value: spec.valueAt(spec.firstStops + i * size), label: spec.format(raw[i]) }));
	}
	const frozen = Object.freeze(marks);
	cache.set(key, frozen);
	return frozen;
}

/** The number a mark's label stands for (5.6 for 'f/5.6', 0.004 for '1/250', 2 for '2"'), unitless. */
export function labelNumber(label: string): number {
	const text = label.replace(/^f\//, '').replace(/"$/, '');
	const slash = text.indexOf('/');
	return slash >= 0 ? Number(text.slice(0, slash)) / Number(text.slice(slash + 1)) : Number(text);
}

/** Nearest mark of a series to `value` (f-number, seconds or ISO) at a step of 1, 1/2 or 1/3 stop. */
// A value equal to a mark's printed number (Exif stores 1/250, not 1/256) maps to that mark; otherwise nearest in stops.
export function nearestMarked(value: number, kind: SeriesKind, step: number = STOP_STEPS.third): MarkedValue {
	const v = requirePositive('value', value);
	const marks = markedSeries(kind, step);
	const named = marks.find((m) => Math.abs(labelNumber(m.label) - v) <= v * 1e-9);
	if (named) return named;
	let best = marks[0];
	let bestDistance = Infinity;
	for (const m of marks) {
		const d = Math.abs(Math.log2(v / m.value));
		if (d < bestDistance) {
			best = m;
			bestDistance = d;
		}
	}
	return best;
}
