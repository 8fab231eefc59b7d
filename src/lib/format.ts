// Display formatting shared by pages (money, minutes).
export function formatPrice(cents: number, currency: string): string {
	return new Intl.NumberFormat('en', { style: 'currency', currency: currency.toUpperCase() }).format(cents / 100);
}
