// One way to show numbers everywhere (widgets, charts, verdicts): one rounding rule, one minus sign, one plural rule.
//
// Rounding: half away from zero at the shown digits; a value that rounds to zero is "0" (never "−0.0").
// Unit words: singular when the shown amount is exactly one or a fraction of one (1 stop, ⅓ stop, ½ stop);
// every other amount takes the plural (0 stops, 0.6 stops, 1.2 stops, 1⅔ stops). Unit symbols never change:
// K, mm, m, px, EV and mired (a unit symbol here, like K: '60 mired').

export const MINUS = '\u2212';

/** Rounds half away from zero to `digits` decimals (so −0.05 → −0.1 as 0.05 → 0.1) and never returns −0. */
export function roundTo(value: number, digits = 1): number {
	const scale = 10 ** digits;
	// the tiny nudge keeps binary artefacts (1.005 stored as 1.00499…) on the side a person expects
	const rounded = (Math.sign(value) * Math.round(Math.abs(value) * scale + 1e-9)) / scale;
	return rounded === 0 ? 0 : rounded;
}

function withMinus(text: string): string {
	return text.replace('-', MINUS);
}

/** Fixed decimals with a typographic minus, for live readouts that should not change width: '2.0', '−0.4', '0.0'. */
export function formatNumber(value: number, digits = 1): string {
	return withMinus(roundTo(value, digits).toFixed(digits));
}

/** Fixed decimals with an explicit sign for differences: '+0.6', '−2.0', '0.0' (zero has no sign). */
export function formatSigned(value: number, digits = 1): string {
	const r = roundTo(value, digits);
	return r > 0 ? `+${r.toFixed(digits)}` : withMinus(r.toFixed(digits));
}

/** Up to `digits` decimals, trailing zeros dropped, for numbers in sentences: '1', '0.6', '−1.2'. */
export function formatDecimal(value: number, digits = 1): string {
	return withMinus(String(roundTo(value, digits)));
}

const FRACTIONS: ReadonlyArray<[number, string]> = [
	[0, ''],
	[1 / 4, '¼'],
	[1 / 3, '⅓'],
	[1 / 2, '½'],
	[2 / 3, '⅔'],
	[3 / 4, '¾'],
	[1, '']
];
// 0.34 and 0.33 are both "a third" to a photographer (common practice, no published source)
const FRACTION_SLACK = 0.012;
const GLYPHS = new Set(FRACTIONS.map(([, g]) => g).filter(Boolean));

/** Thirds, quarters and halves as photographers write them ('⅓', '1½', '−⅔'); anything else to one decimal ('0.6'). */
export function formatFraction(value: number): string {
	const sign = value < 0 ? MINUS : '';
	const a = Math.abs(value);
	const whole = Math.floor(a + FRACTION_SLACK);
	const rest = a - whole;
	for (const [f, glyph] of FRACTIONS) {
		if (Math.abs(rest - f) <= FRACTION_SLACK) {
			const w = f === 1 ? whole + 1 : whole;
			if (w === 0 && !glyph) return '0';
			return `${sign}${w === 0 && glyph ? '' : w}${glyph}`;
		}
	}
	return formatDecimal(value, 1);
}

/** A whole number of thirds of a stop as a mixed fraction: 5 → '1⅔', 3 → '1', 1 → '⅓', 0 → '0'. */
export function formatThirds(thirds: number): string {
	return formatFraction(Math.round(thirds) / 3);
}

/** The unit word for a number as shown: singular for one or a fraction of one ('⅓', '1.0', '+1'), else plural. */
export function unitWord(shown: string, singular: string, plural: string): string {
	const magnitude = shown.replace(/^[+\-\u2212]/, '');
	if (GLYPHS.has(magnitude)) return singular;
	return Number(magnitude) === 1 ? singular : plural;
}

type StopsStyle = {
	/** '+0.6 stops' rather than '0.6 stops' */
	signed?: boolean;
	/** thirds and halves as fractions where the value is one (amounts an author typed) */
	fractions?: boolean;
	/** decimals shown (default 1) */
	digits?: number;
};

/** A number of stops with its unit: '1 stop', '0.6 stops', '⅓ stop' (fractions), '+1.2 stops' (signed). */
export function formatStops(value: number, style: StopsStyle = {}): string {
	const digits = style.digits ?? 1;
	let text = style.fractions ? formatFraction(value) : formatDecimal(value, digits);
	if (style.signed && roundTo(value, digits) > 0) text = `+${text}`;
	return `${text} ${unitWord(text, 'stop', 'stops')}`;
}

/** 'stop' or 'stops' for an amount shown with `digits` fixed decimals (for readouts that print the number apart). */
export function stopWord(value: number, digits = 1): string {
	return unitWord(formatNumber(value, digits), 'stop', 'stops');
}

/** Colour temperature to the nearest 100 K: '6500 K'. */
export function formatKelvin(kelvin: number): string {
	return `${roundTo(kelvin / 100, 0) * 100} K`;
}

/** Mireds, whole numbers, the unit as a symbol: '60 mired', '−131 mired', '+159 mired' (signed). */
export function formatMired(value: number, style: { signed?: boolean } = {}): string {
	const r = roundTo(value, 0);
	return `${style.signed && r > 0 ? `+${r}` : withMinus(String(r))} mired`;
}

/** Millimetres: one decimal below 10 mm, whole above: '4.5 mm', '35 mm'. */
export function formatMm(mm: number): string {
	return `${formatDecimal(mm, Math.abs(mm) < 10 ? 1 : 0)} mm`;
}

/**
 * A lens's focal length, with its full-frame equivalent only when that says something new:
 * '35 mm' (full frame), '23 mm (35 mm full-frame equivalent)'.
 */
export function formatFocalLength(mm: number, mm35?: number | null): string {
	const actual = formatMm(mm);
	if (!mm35 || formatMm(mm35) === actual) return actual;
	return `${actual} (${formatMm(mm35)} full-frame equivalent)`;
}

/** Metres with one decimal below 10 m and whole metres above: '2.5 m', '12 m'. */
export function formatMetres(metres: number, digits?: number): string {
	return `${formatDecimal(metres, digits ?? (Math.abs(metres) < 10 ? 1 : 0))} m`;
}

/** A share as a percentage with one decimal: '0.4 %' is written '0.4%' as on camera screens. */
export function formatPercent(value: number, digits = 1): string {
	return `${formatNumber(value, digits)}%`;
}
