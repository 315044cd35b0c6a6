// Pincer's list price and trial, shown on the landing page and at sign-up. The Stripe price that
// is actually charged (STRIPE_PRICE_ID) should match; the billing page shows Stripe's own figure.
import Decimal from 'decimal.js';
import { formatMoney } from './format';

export const seatPrice = {
	/** Per seat, per month, as an exact decimal string. */
	amount: '29.00',
	currency: 'USD',
	interval: 'month'
} as const;

export const trial = { days: 14, seats: 3 } as const;

/** "29.00" in USD → "$29.00"; other currencies keep their code: "27.00 EUR". */
export function formatPrice(amount: string, currency: string): string {
	const figure = formatMoney(amount);
	return currency.toUpperCase() === 'USD' ? `$${figure}` : `${figure} ${currency.toUpperCase()}`;
}

/** The monthly total for `seats` seats at the list price, exact ("29.00" × 5 → "145.00"). */
export function monthlyFor(seats: number): string {
	return new Decimal(seatPrice.amount).times(seats).toFixed(2);
}
