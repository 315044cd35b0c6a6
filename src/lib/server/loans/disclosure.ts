import Decimal from 'decimal.js';
import type { SolveResult } from '../../schemas/solve';

/** Shown with every disclosure on screen, in print, in exports and in e-mails. */
export const CAUTION =
	'This result follows the published method as implemented in Pincer. Your institution’s compliance officer and the regulation text govern, and local rules may differ. It is not legal advice.';

/**
 * How many decimal places of the rate (as a fraction per year) the certificate pins down:
 * the largest d with width × (unit periods per year) < 10^−d.
 */
export function correctDecimals(result: SolveResult): number | null {
	const root = result.status === 'solved' ? result.roots[0] : null;
	if (!root) return null;
	const width = new Decimal(root.certificate.high)
		.minus(root.certificate.low)
		.times(result.unitPeriodsPerYear ?? 1);
	if (width.lte(0)) return 40;
	return Math.max(0, Math.floor(-width.log(10).toNumber()));
}
