// Display formatting shared by the widgets: signed stops, plain numbers with a true minus sign, thirds as fractions.

const MINUS = '\u2212';

/** A number with `digits` decimals and a typographic minus; −0.0 shows as 0.0. */
export function showNumber(value: number, digits = 1): string {
	const text = value.toFixed(digits);
	if (Number(text) === 0) return (0).toFixed(digits);
	return text.replace('-', MINUS);
}

/** A signed difference in stops, one decimal: '+0.6', '−2.0', '0.0'. */
export function showStops(value: number, digits = 1): string {
	const text = showNumber(value, digits);
	return Number(value.toFixed(digits)) > 0 ? `+${text}` : text;
}

/** A whole number of thirds of a stop as a mixed fraction: 5 → '1⅔', 3 → '1', 1 → '⅓', 0 → '0'. */
export function showThirds(thirds: number): string {
	const sign = thirds < 0 ? MINUS : '';
	const whole = Math.floor(Math.abs(thirds) / 3);
	const part = ['', '⅓', '⅔'][Math.abs(thirds) % 3];
	return `${sign}${whole === 0 && part ? '' : whole}${part}`;
}

/** 'stop' or 'stops' for an amount shown with `digits` decimals. */
export function stopWord(value: number, digits = 1): string {
	return Math.abs(Number(value.toFixed(digits))) === 1 ? 'stop' : 'stops';
}
