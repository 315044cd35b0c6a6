import { Dec, TWO } from './decimal';
import type { Bracket, Evaluate } from './bisect';
import type { DecimalValue } from './npv';

/** Signs differ, and each end's |NPV| exceeds its rounding bound: a root is proven inside. */
export function opposite(atLow: DecimalValue, atHigh: DecimalValue): boolean {
	const sure = (at: DecimalValue) => !at.value.isZero() && at.value.abs().gt(at.bound);
	return sure(atLow) && sure(atHigh) && atLow.value.isNeg() !== atHigh.value.isNeg();
}

export interface SeedCertificate {
	bracket: Bracket | null;
	/** Decimal evaluations spent (two per attempt). */
	evaluations: number;
}

/**
 * Turns a float64 estimate into a decimal certificate. First try [x − ε/2, x + ε/2]: when the
 * float64 narrowing was accurate this is already narrower than the rate tolerance and costs two
 * decimal evaluations. Otherwise widen 64-fold per attempt, up to the scan cell itself.
 */
export function certifySeed(
	evaluate: Evaluate,
	estimate: Dec,
	cell: { low: Dec; high: Dec },
	tolerance: Dec,
	lowest: Dec
): SeedCertificate {
	let halfWidth = tolerance.div(TWO);
	let evaluations = 0;
	for (let attempt = 0; attempt < 12; attempt += 1) {
		let low = estimate.minus(halfWidth);
		let high = estimate.plus(halfWidth);
		if (low.lt(cell.low)) low = cell.low;
		if (high.gt(cell.high)) high = cell.high;
		if (!low.gt(lowest)) low = lowest.plus(estimate).div(TWO);
		if (!low.lt(high)) break;
		const atLow = evaluate(low);
		const atHigh = evaluate(high);
		evaluations += 2;
		if (opposite(atLow, atHigh)) return { bracket: { low, high, atLow, atHigh }, evaluations };
		if (low.eq(cell.low) && high.eq(cell.high)) break;
		halfWidth = halfWidth.times(64);
	}
	return { bracket: null, evaluations };
}
