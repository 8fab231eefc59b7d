// Prices as learners read them: the course's currency, two decimals.

// Making a number format costs far more than using one (tens of microseconds against well under one): one per currency.
const byCurrency = new Map<string, Intl.NumberFormat>();

export function formatPrice(cents: number, currency: string): string {
	const code = currency.toUpperCase();
	let format = byCurrency.get(code);
	if (!format) {
		format = new Intl.NumberFormat('en', { style: 'currency', currency: code });
		// a handful of currencies in practice; the bound only guards against a flood of made-up codes
		if (byCurrency.size >= 32) byCurrency.clear();
		byCurrency.set(code, format);
	}
	return format.format(cents / 100);
}
