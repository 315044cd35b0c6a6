/** "Amount financed: $1,000.00" — money grouped as text, never through a float. */
export function formatLine(label: string, amount: string): string {
	const [whole, cents = '00'] = amount.replace('-', '').split('.');
	const sign = amount.startsWith('-') ? '−' : '';
	return `${label}: ${sign}$${whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',')}.${cents.padEnd(2, '0')}`;
}
