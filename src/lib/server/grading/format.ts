// The grader's words for numbers, all from the one shared formatter (src/lib/format) so verdicts read like widgets.
import { formatFraction, formatStops as formatStopsShared, MINUS } from '../../format/numbers';

export { formatDecimal, formatKelvin, formatMired, formatMm, formatFocalLength } from '../../format/numbers';

/** 2 → '2', 0.34 → '⅓', 1.5 → '1½', 0.4 → '0.4': for targets and tolerances an author typed. */
export const formatAmount = formatFraction;

/** A measured number of stops, direction left to the sentence: '1.2 stops', '1 stop', '0 stops'. */
export function formatStops(value: number): string {
	return formatStopsShared(Math.abs(value));
}

/** An amount of stops as the author wrote it: '⅓ stop', '2 stops', '1½ stops', '0.6 stops'. */
export function formatStopAmount(value: number): string {
	return formatStopsShared(value, { fractions: true });
}

/** '2 ± ⅓' */
export function formatTarget(target: number, tolerance: number): string {
	return `${formatFraction(target)} ± ${formatFraction(tolerance)}`;
}

/** '+1', '−⅔', '0' for bracket offsets in EV. */
export function formatOffset(value: number): string {
	const text = formatFraction(value);
	return text !== '0' && !text.startsWith(MINUS) ? `+${text}` : text;
}


/** Author text closed as a sentence: 'the pose' → 'the pose.' */
export function sentence(text: string): string {
	const t = text.trim();
	return /[.!?]$/.test(t) ? t : `${t}.`;
}
