// Display helpers for exact decimal strings. No floats: digits are grouped as text.
import Decimal from 'decimal.js';

/** "1234567.5" → "1,234,567.50" (two decimals, half-up). */
export function formatMoney(value: string | null | undefined): string {
	if (value === null || value === undefined || value === '') return '—';
	const fixed = new Decimal(value).toFixed(2, Decimal.ROUND_HALF_UP);
	const negative = fixed.startsWith('-');
	const [whole, cents] = fixed.replace('-', '').split('.');
	return `${negative ? '−' : ''}${whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',')}.${cents}`;
}

/** A fraction as a percent with `places` decimals: "0.128255" → "12.8255%". */
export function formatPercent(fraction: string | null | undefined, places = 4): string {
	if (fraction === null || fraction === undefined) return '—';
	return `${new Decimal(fraction).times(100).toFixed(places, Decimal.ROUND_HALF_UP).replace('-', '−')}%`;
}

/** A decimal string shortened to `digits` significant digits for tables (exact value in a title). */
export function formatSignificant(value: string, digits = 12): string {
	return new Decimal(value).toSignificantDigits(digits).toString().replace('-', '−');
}

export function formatDateTime(value: Date | string): string {
	return new Date(value).toISOString().replace('T', ' ').slice(0, 16) + ' UTC';
}

/** A percent as typed or stored ("10.000000" → "10.00", "10.125" → "10.125"): at least 2 decimals. */
export function formatEnteredPercent(value: string): string {
	const d = new Decimal(value);
	return d.toFixed(Math.max(2, d.decimalPlaces()));
}
