// Amounts in a currency's smallest unit (cents) and how to show them; minor units follow ISO 4217 via Intl.

/** @param {string} currency lower-case ISO code */
export function isKnownCurrency(currency) {
	return /^[a-z]{3}$/.test(currency) && Intl.supportedValuesOf('currency').includes(currency.toUpperCase());
}

/**
 * @param {number} minor amount in the smallest unit
 * @param {string} currency
 */
export function formatAmount(minor, currency) {
	const format = new Intl.NumberFormat('en-US', { style: 'currency', currency: currency.toUpperCase() });
	const digits = format.resolvedOptions().maximumFractionDigits ?? 2;
	return format.format(minor / 10 ** digits);
}
