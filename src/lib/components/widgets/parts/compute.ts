// Runs an engine calculation and turns a thrown error into a message, so a widget shows it instead of crashing.

/** A calculation's value, or the reason it could not be computed. */
export type Computed<T> = { ok: true; value: T } | { ok: false; message: string };

/** Calls `fn`; any thrown error (the engine throws ExposureInputError with a plain message) becomes `{ ok: false }`. */
export function attempt<T>(fn: () => T): Computed<T> {
	try {
		return { ok: true, value: fn() };
	} catch (error) {
		return { ok: false, message: error instanceof Error ? error.message : String(error) };
	}
}
