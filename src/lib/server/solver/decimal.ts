import Decimal from 'decimal.js';

/** Significant digits of every decimal evaluation that decides a rate. */
export const PRECISION = 40;

/**
 * The engine's one Decimal clone. Plain notation for anything between 1e-60 and 1e60 so that
 * rates and amounts come back as ordinary decimal strings.
 */
export const Dec = Decimal.clone({
	precision: PRECISION,
	rounding: Decimal.ROUND_HALF_EVEN,
	toExpNeg: -60,
	toExpPos: 60
});
export type Dec = Decimal;

/** Relative rounding error of one operation at PRECISION digits (half a unit in the last place). */
export const UNIT_ROUNDOFF = 5 * 10 ** -PRECISION;

export const ZERO = new Dec(0);
export const ONE = new Dec(1);
export const TWO = new Dec(2);

/** A decimal as a plain string (exponent form only beyond 1e±60). */
export function toPlain(value: Dec): string {
	return value.toString();
}

/** Percent with `places` decimals, rounded half-up from the full value (disclosure rule). */
export function percentHalfUp(fraction: Dec, places: number): string {
	return fraction.times(100).toDecimalPlaces(places, Decimal.ROUND_HALF_UP).toFixed(places);
}

/** A positive decimal close to 10^exponent10, for rounding bounds computed in float64 logs. */
export function powerOfTen(exponent10: number): Dec {
	if (!Number.isFinite(exponent10)) return exponent10 > 0 ? new Dec('1e9000000') : ZERO;
	return new Dec(`1e${Math.ceil(exponent10)}`);
}

/** Smallest n ≥ 0 with width / 2^n < 2·tolerance: bisection's iteration count, decided exactly. */
export function bisectionCount(width: Dec, tolerance: Dec): number {
	if (width.lte(0)) return 0;
	const target = tolerance.times(2);
	const guess = Math.floor(Math.log2(width.div(target).toNumber()));
	let n = Number.isFinite(guess) ? Math.max(0, guess - 2) : 0;
	while (!width.lt(target.times(TWO.pow(n)))) n += 1;
	while (n > 0 && width.lt(target.times(TWO.pow(n - 1)))) n -= 1;
	return n;
}
