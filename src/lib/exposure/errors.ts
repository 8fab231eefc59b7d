// Input checks shared by the exposure engine; bad input throws one clear, catchable error type.

/** Thrown when an argument is outside what the maths can honestly answer (message says which and why). */
export class ExposureInputError extends RangeError {
	constructor(message: string) {
		super(message);
		this.name = 'ExposureInputError';
	}
}

/** Throws unless `value` is a finite number; returns it (unitless). */
export function requireFinite(name: string, value: unknown): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new ExposureInputError(`${name} must be a finite number, got ${String(value)}`);
	}
	return value;
}

/** Throws unless `value` is a finite number above zero; returns it (unit given by the caller). */
export function requirePositive(name: string, value: unknown, unit = ''): number {
	const n = requireFinite(name, value);
	if (n <= 0) {
		throw new ExposureInputError(`${name} must be greater than 0${unit ? ` ${unit}` : ''}, got ${n}`);
	}
	return n;
}

/** Throws unless `value` is a finite number at or above zero; returns it (unit given by the caller). */
export function requireNonNegative(name: string, value: unknown, unit = ''): number {
	const n = requireFinite(name, value);
	if (n < 0) {
		throw new ExposureInputError(`${name} must be 0 or more${unit ? ` ${unit}` : ''}, got ${n}`);
	}
	return n;
}
