import type { RegularityResult, SolveResult } from '../../schemas/solve';
import { classifyInterval, intervalKey, scheduledDay } from './unit-period';
import { parseDate } from './day-count';
import { Dec, toPlain } from './decimal';

/** 12 CFR 1026.22(a)(2): 1/8 of 1 percentage point; (a)(3): 1/4 of 1 percentage point. */
export const REGULAR_TOLERANCE = new Dec('0.00125');
export const IRREGULAR_TOLERANCE = new Dec('0.0025');

export interface LoanSchedule {
	advances: ReadonlyArray<{ date: string; amount: string }>;
	payments: ReadonlyArray<{ date: string; amount: string }>;
}

/**
 * 12 CFR 1026.22(a)(2)–(3): a transaction is irregular if it has multiple advances, irregular
 * payment periods or irregular payment amounts; an irregular first period and an irregular first
 * or final payment do not make it irregular.
 */
export function regularity(loan: LoanSchedule): RegularityResult {
	const reasons: string[] = [];
	if (loan.advances.length > 1) reasons.push(`multiple advances (${loan.advances.length})`);
	const dates = loan.payments.map((p) => parseDate(p.date));
	const day = scheduledDay(dates);
	const periods = new Set<string>();
	for (let k = 1; k < dates.length; k += 1) {
		periods.add(intervalKey(classifyInterval(dates[k - 1], dates[k], day)));
	}
	if (periods.size > 1) reasons.push('irregular payment periods (after the first period)');
	const middle = loan.payments.slice(1, -1).map((p) => p.amount);
	const same = (a: string, b: string) => a === b || new Dec(a).eq(b);
	if (middle.some((amount) => !same(amount, middle[0]))) {
		reasons.push('irregular payment amounts (other than the first or final payment)');
	}
	const irregular = reasons.length > 0;
	return {
		classification: irregular ? 'irregular' : 'regular',
		tolerance: toPlain(irregular ? IRREGULAR_TOLERANCE : REGULAR_TOLERANCE),
		reasons
	};
}

export interface ToleranceCheck {
	accurate: boolean;
	/** The disclosed APR checked, as a fraction. */
	disclosed: string;
	/** Accepted disclosures, as fractions: the certified APR interval widened by the tolerance. */
	accepted: { low: string; high: string } | null;
	tolerance: string | null;
	classification: RegularityResult['classification'] | null;
	reason: string;
}

type CheckableResult = Pick<
	SolveResult,
	'kind' | 'status' | 'roots' | 'regularity' | 'unitPeriodsPerYear'
>;

/**
 * Whether a disclosed APR (a fraction, e.g. "0.1") is accurate under 1026.22(a)(2)–(3) for a
 * solved apr-us result. The accepted interval is the certificate's APR interval (unit-period
 * certificate × unit periods per year) widened by the tolerance on each side, ends included.
 */
export function toleranceCheck(result: CheckableResult, disclosedApr: string): ToleranceCheck {
	const disclosed = new Dec(disclosedApr);
	const refuse = (reason: string): ToleranceCheck => ({
		accurate: false,
		disclosed: toPlain(disclosed),
		accepted: null,
		tolerance: null,
		classification: result.regularity?.classification ?? null,
		reason
	});
	if (result.kind !== 'apr-us')
		return refuse('Tolerances of 1026.22 apply to apr-us results only.');
	if (result.status !== 'solved' || result.roots.length !== 1 || !result.regularity) {
		return refuse('The APR is not determined (no single root), so no disclosure can be checked.');
	}
	const perYear = new Dec(result.unitPeriodsPerYear ?? '1');
	const tolerance = new Dec(result.regularity.tolerance);
	const { certificate } = result.roots[0];
	const low = new Dec(certificate.low).times(perYear).minus(tolerance);
	const high = new Dec(certificate.high).times(perYear).plus(tolerance);
	const accurate = disclosed.gte(low) && disclosed.lte(high);
	const points = tolerance.times(100).toString();
	return {
		accurate,
		disclosed: toPlain(disclosed),
		accepted: { low: toPlain(low), high: toPlain(high) },
		tolerance: toPlain(tolerance),
		classification: result.regularity.classification,
		reason: accurate
			? `Within ${points} percentage point of the APR (${result.regularity.classification} transaction).`
			: `More than ${points} percentage point from the APR (${result.regularity.classification} transaction).`
	};
}
