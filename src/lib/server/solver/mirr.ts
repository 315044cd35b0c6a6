import { Dec, ONE, ZERO, toPlain } from './decimal';

/**
 * Modified IRR of equal-period flows (first at period 0), per period: negative flows discounted
 * to period 0 at `financeRate`, positive flows compounded to the last period at `reinvestRate`,
 * MIRR = (FV of inflows / −PV of outflows)^(1/(n−1)) − 1. Null when the flows lack either sign
 * or there is only one period.
 */
export function mirr(
	flows: readonly string[],
	financeRate: string,
	reinvestRate: string
): string | null {
	const n = flows.length;
	if (n < 2) return null;
	const finance = ONE.plus(financeRate);
	const reinvest = ONE.plus(reinvestRate);
	if (!finance.gt(0) || !reinvest.gt(0)) return null;
	let outflows = ZERO;
	let inflows = ZERO;
	flows.forEach((text, k) => {
		const amount = new Dec(text);
		if (amount.isNeg()) outflows = outflows.plus(amount.div(finance.pow(k)));
		else inflows = inflows.plus(amount.times(reinvest.pow(n - 1 - k)));
	});
	if (outflows.isZero() || inflows.isZero()) return null;
	const ratio = inflows.div(outflows.neg());
	return toPlain(
		ratio
			.ln()
			.div(n - 1)
			.exp()
			.minus(ONE)
	);
}
