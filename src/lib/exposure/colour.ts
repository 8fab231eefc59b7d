// Colour temperature arithmetic in mireds, and the common CTO/CTB gels (the Gel Mixer's maths).
import { ExposureInputError, requirePositive } from './errors';

/** Mired value of a colour temperature: 1,000,000 / K, in mireds. */
export function mired(k: number): number {
	return 1e6 / requirePositive('colour temperature', k, 'K');
}

/** Colour temperature of a mired value: 1,000,000 / mired, in kelvin. */
export function kelvin(miredValue: number): number {
	return 1e6 / requirePositive('mired value', miredValue, 'mired');
}

/** Identifier of a colour-correction gel. */
export type GelId = 'full-cto' | 'half-cto' | 'quarter-cto' | 'full-ctb' | 'half-ctb';

/** A colour-correction gel: its name and mired shift (positive warms, negative cools). */
export interface Gel {
	id: GelId;
	label: string;
	mired: number;
}

// Common practice, no published source: typical swatch-book mired shifts of one widely used gel range, as commonly
// quoted (from memory and secondary sources); other makers' gels of the same name differ by up to ~20 mired.
/** The common gels with their mired shifts (mired); iterate with Object.values(gels). */
export const gels: Readonly<Record<GelId, Gel>> = Object.freeze({
	'full-cto': Object.freeze({ id: 'full-cto', label: 'Full CTO', mired: 159 }),
	'half-cto': Object.freeze({ id: 'half-cto', label: '1/2 CTO', mired: 109 }),
	'quarter-cto': Object.freeze({ id: 'quarter-cto', label: '1/4 CTO', mired: 64 }),
	'full-ctb': Object.freeze({ id: 'full-ctb', label: 'Full CTB', mired: -137 }),
	'half-ctb': Object.freeze({ id: 'half-ctb', label: '1/2 CTB', mired: -78 })
} as const);

/** Colour temperature in kelvin of a `k` kelvin source seen through a gel (mired shifts add). */
export function applyGel(k: number, gel: Gel | GelId): number {
	const g = typeof gel === 'string' ? gels[gel] : gel;
	if (!g || typeof g.mired !== 'number' || !Number.isFinite(g.mired)) {
		throw new ExposureInputError(`unknown gel ${JSON.stringify(gel)}; use one of ${Object.keys(gels).join(', ')}`);
	}
	const m = mired(k) + g.mired;
	if (m <= 0) {
		throw new ExposureInputError(`${g.label} cannot cool ${k} K any further: the result is beyond any colour temperature`);
	}
	return kelvin(m);
}
