// Flash exposure: guide numbers, inverse-square falloff, power steps, high-speed-sync cost and flash/ambient mixing.
import { ExposureInputError, requireNonNegative, requirePositive } from './errors';

/** Guide number (metres) at this ISO and power fraction, from the full-power ISO 100 guide number in metres. */
// Exposure scales with ISO and power, and the f-number with the square root of exposure, hence the square roots.
export function guideNumber(gnAtFull: number, options: { iso?: number; power?: number } = {}): number {
	const gn = requirePositive('guide number', gnAtFull, 'm');
	const iso = requirePositive('iso', options.iso ?? 100);
	const power = requirePositive('power', options.power ?? 1, '(fraction of full power)');
	if (power > 1) throw new ExposureInputError(`power is a fraction of full power (1 = full), got ${power}`);
	return gn * Math.sqrt(iso / 100) * Math.sqrt(power);
}

/** F-number that correctly exposes a subject at `distance` metres with guide number `gn` (metres): N = GN / d. */
export function flashAperture(gn: number, distance: number): number {
	return requirePositive('guide number', gn, 'm') / requirePositive('distance', distance, 'm');
}

/** Distance in metres at which guide number `gn` (metres) correctly exposes at f-number `aperture`: d = GN / N. */
export function flashDistance(gn: number, aperture: number): number {
	return requirePositive('guide number', gn, 'm') / requirePositive('aperture', aperture, '(f-number)');
}

/** Flash setup: full-power GN (m, ISO 100), power fraction, subject distance (m), f-number and ISO. */
export interface FlashSetup {
	gn: number;
	power?: number;
	distance: number;
	aperture: number;
	iso?: number;
}

/** Stops above (+) or below (−) correct exposure of the flash-lit subject, in stops (inverse-square law). */
export function flashStops(setup: FlashSetup): number {
	if (setup === null || typeof setup !== 'object') {
		throw new ExposureInputError('flash setup must be an object { gn, power, distance, aperture, iso }');
	}
	const gn = guideNumber(setup.gn, { iso: setup.iso, power: setup.power });
	const correct = flashAperture(gn, setup.distance);
	const used = requirePositive('aperture', setup.aperture, '(f-number)');
	return 2 * Math.log2(correct / used);
}

/** How many stops less flash reaches `far` metres than `near` metres (inverse-square), in stops. */
export function falloffStops(near: number, far: number): number {
	return 2 * Math.log2(requirePositive('far', far, 'm') / requirePositive('near', near, 'm'));
}

/** A manual flash power setting: fraction of full power, its label and stops below full. */
export interface PowerStep {
	power: number;
	label: string;
	stopsBelowFull: number;
}

/** Manual power settings 1/1 … 1/256 with their stops below full power. */
export const powerSteps: readonly PowerStep[] = Object.freeze(
	Array.from({ length: 9 }, (_, i) => Object.freeze({ power: 2 ** -i, label: `1/${2 ** i}`, stopsBelowFull: i }))
);

// Marked speeds differ from their names (the '1/250' mark is 1/256 s), so a shutter this close to sync counts as at sync.
const SYNC_TOLERANCE_STOPS = 1 / 8;

/** Stops of flash lost to high-speed sync: 0 at or below sync speed, else entryLoss + log2(syncSpeed / shutter). */
// entryLoss defaults to 1 stop: common practice, no published source (pulsed HSS output varies by flash model).
export function hssCost(args: { shutter: number; syncSpeed: number; entryLoss?: number }): number {
	const shutter = requirePositive('shutter', args?.shutter, 's');
	const sync = requirePositive('syncSpeed', args.syncSpeed, 's');
	const entryLoss = requireNonNegative('entryLoss', args.entryLoss ?? 1, 'stops');
	const over = Math.log2(sync / shutter);
	return over <= SYNC_TOLERANCE_STOPS ? 0 : entryLoss + over;
}

/** Exposure of a subject lit by ambient and flash together, in stops: log2(2^a + 2^f); −Infinity means no light. */
export function mix(args: { ambientStops: number; flashStops: number }): number {
	const a = args?.ambientStops;
	const f = args?.flashStops;
	for (const [name, v] of [['ambientStops', a], ['flashStops', f]] as const) {
		if (typeof v !== 'number' || Number.isNaN(v)) {
			throw new ExposureInputError(`${name} must be a number of stops (or -Infinity for no light), got ${String(v)}`);
		}
	}
	const hi = Math.max(a, f);
	if (hi === -Infinity) return -Infinity;
	if (hi === Infinity) return Infinity;
	// Factor out the larger term so 2^x neither overflows nor underflows for large stop values.
	return hi + Math.log2(2 ** (a - hi) + 2 ** (f - hi));
}
