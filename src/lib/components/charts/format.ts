/**
 * Display formatting shared by the chart components. Floating point is fine here: these
 * numbers are for reading a picture, never for deciding a rate.
 */

const money = new Intl.NumberFormat('en-US', {
	minimumFractionDigits: 2,
	maximumFractionDigits: 2,
	signDisplay: 'negative'
});

/** A rate given as a fraction (0.25), shown in percent with a fixed number of decimals. */
export function formatRatePercent(rate: number, decimals = 4): string {
	return `${(rate * 100).toFixed(decimals)}%`;
}

/** An amount of money with thousands separators and two decimals. */
export function formatMoney(amount: number): string {
	return money.format(amount);
}

/** A bracket width (a rate, as a fraction) in scientific notation, e.g. 2.441e-4. */
export function formatWidth(width: number): string {
	return width === 0 ? '0' : width.toExponential(3);
}

/** Enough decimals (in percent) that the two ends of a certificate interval print differently. */
export function certificateDecimals(low: number, high: number): number {
	const widthPercent = Math.abs(high - low) * 100;
	if (!(widthPercent > 0)) return 4;
	return Math.min(14, Math.max(4, Math.ceil(-Math.log10(widthPercent)) + 1));
}
