// Parsing and display of shutter times and f-numbers as photographers write them.
import { ExposureInputError, requirePositive } from './errors';
import { markedSeries, STOP_STEPS, type SeriesKind } from './series';

// A value this close to a mark's exact value is that mark (e.g. 2^(5/2) shows as f/5.6, 1/256 s as 1/250).
const SNAP_STOPS = 0.01;

function snapToMark(value: number, kind: SeriesKind, stopsPerLog2: number): string | null {
	for (const step of [STOP_STEPS.third, STOP_STEPS.half]) {
		for (const mark of markedSeries(kind, step)) {
			if (Math.abs(Math.log2(value / mark.value)) * stopsPerLog2 <= SNAP_STOPS) return mark.label;
		}
	}
	return null;
}

/** Reads a shutter time written '1/250', '1/250 s', '2"', '1"5', '0.5' or '2s'; returns seconds. */
export function parseShutter(text: string | number): number {
	if (typeof text === 'number') return requirePositive('shutter', text, 's');
	if (typeof text !== 'string') throw new ExposureInputError(`shutter must be text like '1/250' or '2"', got ${String(text)}`);
	const t = text.trim().toLowerCase().replace(/\s*(s|sec|secs|seconds?)$/, '').replace(/″/g, '"');
	let seconds = NaN;
	const fraction = /^(\d+(?:\.\d+)?)\s*\/\s*(\d+(?:\.\d+)?)$/.exec(t);
	const camera = /^(\d+)"(\d+)$/.exec(t);
	const plain = /^(\d+(?:\.\d+)?|\.\d+)"?$/.exec(t);
	if (fraction) seconds = Number(fraction[1]) / Number(fraction[2]);
	else if (camera) seconds = Number(`${camera[1]}.${camera[2]}`); // cameras print 1.5 s as 1"5
	else if (plain) seconds = Number(plain[1]);
	if (!Number.isFinite(seconds) || seconds <= 0) {
		throw new ExposureInputError(`cannot read shutter time '${text}': write it like 1/250, 2" or 0.5`);
	}
	return seconds;
}

/** Shows a shutter time in seconds as cameras do: '1/250' below 0.3 s, '0.8"' or '2"' from 0.3 s up (marks by name). */
export function formatShutter(seconds: number): string {
	const t = requirePositive('shutter', seconds, 's');
	const mark = snapToMark(t, 'shutter', 1);
	if (mark) return mark;
	const denominator = Math.round(1 / t);
	// Below 0.3 s cameras write 1/N; where N would be far from 1/t (e.g. 1/3.4 s) decimals keep the time honest.
	if (t < 0.3 && (t < 0.1 || Math.abs(denominator * t - 1) <= 0.05)) return `1/${denominator}`;
	const shown = t < 1 ? Number(t.toPrecision(2)) : t < 10 ? Math.round(t * 10) / 10 : Math.round(t);
	return `${shown}"`;
}

/** Reads an f-number written 'f/5.6', 'F5.6', 'ƒ/5.6' or '5.6'; returns N (unitless). */
export function parseAperture(text: string | number): number {
	if (typeof text === 'number') return requirePositive('aperture', text, '(f-number)');
	if (typeof text !== 'string') throw new ExposureInputError(`aperture must be text like 'f/5.6', got ${String(text)}`);
	const m = /^(?:[fƒ]\s*\/?\s*)?(\d+(?:\.\d+)?|\.\d+)$/i.exec(text.trim());
	const n = m ? Number(m[1]) : NaN;
	if (!Number.isFinite(n) || n <= 0) {
		throw new ExposureInputError(`cannot read aperture '${text}': write it like f/5.6`);
	}
	return n;
}

/** Shows an f-number as 'f/5.6' (marked name when it is a marked aperture, else one decimal below f/10). */
export function formatAperture(n: number): string {
	const v = requirePositive('aperture', n, '(f-number)');
	// One stop of aperture is a factor √2 in N, so stops = 2·log2(ratio).
	const mark = snapToMark(v, 'aperture', 2);
	if (mark) return mark;
	const shown = v < 1 ? Number(v.toPrecision(2)) : v < 10 ? Math.round(v * 10) / 10 : Math.round(v);
	return `f/${shown}`;
}
