import Decimal from 'decimal.js';

export type FinanceChargeCheck = {
	accurate: boolean;
	/** Disclosed minus actual, in dollars: positive when overstated. */
	difference: string;
	rule: string;
	accepted: { low: string; high: string | null };
};

/**
 * 12 CFR 1026.18(d): a disclosed finance charge is treated as accurate when, for a loan secured by
 * real property or a dwelling ((d)(1)), it is understated by no more than $100 or is greater than
 * required; otherwise ((d)(2)) it is within $5 of the actual when the amount financed is $1,000 or
 * less, within $10 when more.
 */
export function financeChargeTolerance(
	actual: string,
	disclosed: string,
	amountFinanced: string,
	securedByRealProperty: boolean
): FinanceChargeCheck {
	const a = new Decimal(actual);
	const d = new Decimal(disclosed);
	const difference = d.minus(a);
	if (securedByRealProperty) {
		const low = a.minus(100);
		return {
			accurate: d.gte(low),
			difference: difference.toFixed(2),
			rule: '1026.18(d)(1): secured by real property or a dwelling — understated by no more than $100, or overstated',
			accepted: { low: low.toFixed(2), high: null }
		};
	}
	const band = new Decimal(amountFinanced).lte(1000) ? 5 : 10;
	return {
		accurate: difference.abs().lte(band),
		difference: difference.toFixed(2),
		rule: `1026.18(d)(2): amount financed ${band === 5 ? '$1,000 or less' : 'over $1,000'} — within $${band} either way`,
		accepted: { low: a.minus(band).toFixed(2), high: a.plus(band).toFixed(2) }
	};
}
