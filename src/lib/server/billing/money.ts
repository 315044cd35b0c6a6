// Stripe counts money in integer minor units (cents); Pincer shows and stores decimal strings.
// The conversion is exact: a shift of the decimal point, never a float division.
import Decimal from 'decimal.js';

/** Currencies Stripe bills without minor units (its "zero-decimal" list). */
const ZERO_DECIMAL = new Set([
	'bif',
	'clp',
	'djf',
	'gnf',
	'jpy',
	'kmf',
	'krw',
	'mga',
	'pyg',
	'rwf',
	'ugx',
	'vnd',
	'vuv',
	'xaf',
	'xof',
	'xpf'
]);

/** Digits after the decimal point of an amount in `currency` (ISO 4217, any case). */
export function minorDigits(currency: string): number {
	return ZERO_DECIMAL.has(currency.toLowerCase()) ? 0 : 2;
}

/**
 * An amount in minor units as an exact decimal string in major units: (2900, 'usd') → "29.00".
 * Accepts Stripe's `unit_amount_decimal` strings too ("2900.5" → "29.005").
 */
export function fromMinorUnits(amount: number | string, currency: string): string {
	const digits = minorDigits(currency);
	const value = new Decimal(amount).div(new Decimal(10).pow(digits));
	return value.toFixed(Math.max(digits, value.decimalPlaces()));
}
