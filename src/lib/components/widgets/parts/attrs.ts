// Reads a widget's string attributes without throwing: each bad one becomes a plain notice and a fallback value.
import { parseAperture, parseShutter } from '$lib/exposure';

/** What a lesson author may have written for an attribute (strings by contract; numbers tolerated). */
export type RawAttr = string | number | null | undefined;

/** Reads an author-typed number: accepts '2.5', '2,5', '−1' and '+3'; null when it is not a plain number. */
export function readNumberText(raw: RawAttr): number | null {
	if (typeof raw === 'number') return Number.isFinite(raw) ? raw : null;
	if (typeof raw !== 'string') return null;
	const text = raw.trim().replace(/^\u2212/, '-').replace(',', '.');
	if (!/^[+-]?(\d+(\.\d*)?|\.\d+)$/.test(text)) return null;
	return Number(text);
}

/** Reads a fraction of full power written '1/4', '1/1', '0.25' or '1'; null when unreadable. */
export function readFractionText(raw: RawAttr): number | null {
	const text = typeof raw === 'string' ? raw.trim() : raw;
	const m = typeof text === 'string' ? /^(\d+(?:\.\d+)?)\s*\/\s*(\d+(?:\.\d+)?)$/.exec(text) : null;
	if (m) return Number(m[2]) > 0 ? Number(m[1]) / Number(m[2]) : null;
	return readNumberText(text);
}

// Marks sit up to about ⅙ stop from their printed numbers (the '1/8000' mark is 1/8192 s), so range ends get that slack.
const RANGE_SLACK = 2 ** (1 / 6);

const present = (raw: RawAttr) => raw !== undefined && raw !== null && String(raw).trim() !== '';

/** Collects notices while reading attributes; a missing attribute quietly takes its documented default. */
export class AttrReader {
	readonly notices: string[] = [];

	private complain(name: string, raw: RawAttr, what: string, shown: string): void {
		this.notices.push(`${name}="${String(raw)}" ${what}; showing ${shown} instead.`);
	}

	/** A number within [min, max] (inclusive); `unit` only words the notice. */
	number(name: string, raw: RawAttr, fallback: number, range: { min: number; max: number; unit?: string }): number {
		if (!present(raw)) return fallback;
		const unit = range.unit ? ` ${range.unit}` : '';
		const n = readNumberText(raw);
		if (n === null) this.complain(name, raw, 'is not a number', `${fallback}${unit}`);
		else if (n < range.min || n > range.max) {
			this.complain(name, raw, `must be between ${range.min} and ${range.max}${unit}`, `${fallback}${unit}`);
		} else return n;
		return fallback;
	}

	/** A shutter time in seconds ('1/250', '2"'), within [min, max] seconds. */
	shutter(name: string, raw: RawAttr, fallback: string, range: { min: number; max: number }): number {
		const standIn = parseShutter(fallback);
		if (!present(raw)) return standIn;
		let t: number;
		try {
			t = parseShutter(String(raw));
		} catch {
			this.complain(name, raw, 'is not a shutter time like 1/250', fallback);
			return standIn;
		}
		if (t >= range.min / RANGE_SLACK && t <= range.max * RANGE_SLACK) return t;
		this.complain(name, raw, 'is outside the range this widget shows', fallback);
		return standIn;
	}

	/** An f-number ('8', 'f/5.6'), within [min, max]. */
	aperture(name: string, raw: RawAttr, fallback: number, range: { min: number; max: number }): number {
		if (!present(raw)) return fallback;
		let n: number;
		try {
			n = parseAperture(String(raw));
		} catch {
			this.complain(name, raw, 'is not an f-number like 8 or f/5.6', `f/${fallback}`);
			return fallback;
		}
		if (n >= range.min && n <= range.max) return n;
		this.complain(name, raw, `must be between f/${range.min} and f/${range.max}`, `f/${fallback}`);
		return fallback;
	}

	/** A fraction of full flash power, 0 < p ≤ 1 ('1/4', '1/1', '0.5'). */
	fraction(name: string, raw: RawAttr, fallback: number, label: string): number {
		if (!present(raw)) return fallback;
		const p = readFractionText(raw);
		if (p !== null && p > 0 && p <= 1) return p;
		this.complain(name, raw, 'is not a power like 1/1, 1/4 or 1/16', label);
		return fallback;
	}

	/** One of a fixed list of words; `aliases` maps other spellings onto it. */
	choice<T extends string>(name: string, raw: RawAttr, allowed: readonly T[], fallback: T, aliases: Record<string, T> = {}): T {
		if (!present(raw)) return fallback;
		const word = String(raw).trim().toLowerCase();
		const found = allowed.find((a) => a === word) ?? aliases[word];
		if (found) return found;
		this.complain(name, raw, `is not one of ${allowed.join(', ')}`, fallback);
		return fallback;
	}

	/** A comma-separated list of known words, in the author's order, without repeats; unknown words are left out. */
	list<T extends string>(name: string, raw: RawAttr, allowed: readonly T[], fallback: readonly T[]): T[] {
		if (!present(raw)) return [...fallback];
		const words = String(raw).split(',').map((w) => w.trim().toLowerCase()).filter(Boolean);
		const known = words.filter((w): w is T => (allowed as readonly string[]).includes(w));
		const unknown = words.filter((w) => !(allowed as readonly string[]).includes(w));
		if (unknown.length) this.notices.push(`${name}: unknown ${unknown.join(', ')} (known: ${allowed.join(', ')}).`);
		const unique = [...new Set(known)];
		return unique.length ? unique : [...fallback];
	}
}
