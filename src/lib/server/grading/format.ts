// Numbers as learners read them: stops in thirds and halves (2 ± ⅓), signed EV, mireds, kelvin.

const FRACTIONS: ReadonlyArray<[number, string]> = [
	[0, ''],
	[1 / 4, '¼'],
	[1 / 3, '⅓'],
	[1 / 2, '½'],
	[2 / 3, '⅔'],
	[3 / 4, '¾'],
	[1, '']
];
// 0.34 and 0.33 are both "a third" to a photographer
const FRACTION_SLACK = 0.012;

/** 2 → '2', 0.34 → '⅓', 1.5 → '1½', 0.4 → '0.4': for targets and tolerances an author typed. */
export function formatAmount(value: number): string {
	const sign = value < 0 ? '−' : '';
	const a = Math.abs(value);
	const whole = Math.floor(a + FRACTION_SLACK);
	const rest = a - whole;
	for (const [f, glyph] of FRACTIONS) {
		if (Math.abs(rest - f) <= FRACTION_SLACK) {
			const w = f === 1 ? whole + 1 : whole;
			return `${sign}${w === 0 && glyph ? '' : w}${glyph}` || '0';
		}
	}
	return `${sign}${Number(a.toFixed(2))}`;
}

/** A measured number of stops with one decimal: '1.2 stops', '1 stop', '0 stops'. */
export function formatStops(value: number): string {
	const rounded = Math.round(Math.abs(value) * 10) / 10;
	return `${rounded} ${rounded === 1 ? 'stop' : 'stops'}`;
}

/** An amount of stops as the author wrote it: '⅓ stop', '2 stops', '1½ stops'. */
export function formatStopAmount(value: number): string {
	const text = formatAmount(value);
	return `${text} ${Math.abs(value) <= 1 + FRACTION_SLACK ? 'stop' : 'stops'}`;
}

/** '2 ± ⅓' */
export function formatTarget(target: number, tolerance: number): string {
	return `${formatAmount(target)} ± ${formatAmount(tolerance)}`;
}

/** '+1', '−⅔', '0' for bracket offsets in EV. */
export function formatOffset(value: number): string {
	const text = formatAmount(value);
	return value > 0 ? `+${text}` : text;
}

export function formatKelvin(k: number): string {
	return `${Math.round(k / 100) * 100} K`;
}

export function formatMired(value: number): string {
	return `${Math.round(value)} ${Math.abs(Math.round(value)) === 1 ? 'mired' : 'mireds'}`;
}

export function formatMm(mm: number): string {
	return `${Number(mm.toFixed(mm < 10 ? 1 : 0))} mm`;
}


/** Author text closed as a sentence: 'the pose' → 'the pose.' */
export function sentence(text: string): string {
	const t = text.trim();
	return /[.!?]$/.test(t) ? t : `${t}.`;
}
