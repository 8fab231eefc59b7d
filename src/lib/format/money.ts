// Prices as learners read them: the course's currency, two decimals.
export function formatPrice(cents: number, currency: string): string {
	return new Intl.NumberFormat('en', { style: 'currency', currency: currency.toUpperCase() }).format(cents / 100);
}
