import Decimal from 'decimal.js';
import type { SolveRequest, SolveResult } from '$lib/schemas/solve';
import { solve } from '../solver';

export type TraceRun = {
	method: 'bisection' | 'itp';
	bracket: { low: string; high: string };
	result: SolveResult;
};

/**
 * A textbook bracket around a solved rate (in the unit the engine solves in: per period for irr
 * and apr-us, per year for dated kinds): [0, 1] for rates from 0 to 100%, widened for larger
 * ones, [−0.5, 0] or [−0.99, 0] for negative ones.
 */
export function textbookBracket(solvedRate: string): { low: string; high: string } {
	const r = new Decimal(solvedRate);
	if (r.gte(0)) return { low: '0', high: r.lt(1) ? '1' : r.times(2).plus(1).toFixed(0) };
	return { low: r.gt(-0.5) ? '-0.5' : '-0.99', high: '0' };
}

/**
 * Re-runs a stored request twice on the same explicit bracket, by bisection and by ITP, with the
 * trace on: what the Trace sections show side by side. Decided in decimal like every solve.
 */
export function traceRuns(request: SolveRequest, stored: SolveResult): TraceRun[] | null {
	const root = stored.status === 'solved' ? stored.roots[0] : null;
	if (!root) return null;
	const solvedRate = root.ratePerPeriod ?? (request.kind === 'irr' ? root.rate : null) ?? root.rate;
	const bracket = textbookBracket(solvedRate);
	return (['bisection', 'itp'] as const).map((method) => ({
		method,
		bracket,
		result: solve({
			...request,
			method,
			bracket,
			trace: true,
			stop: { rateTolerance: '1e-12' }
		} as SolveRequest)
	}));
}

/**
 * Textbook runs for every root of a stored result: each root gets its own bracket, bounded by the
 * midpoints to its neighbours (so each bracket holds exactly that root's sign change), refined by
 * bisection and by ITP with the trace on.
 */
export function traceRunsPerRoot(
	request: SolveRequest,
	stored: SolveResult,
	limit = 4
): TraceRun[][] {
	const rates = stored.roots.map((root) => new Decimal(root.ratePerPeriod ?? root.rate));
	if (rates.length === 0) return [];
	if (rates.length === 1) return [traceRuns(request, stored) ?? []];
	return rates.slice(0, limit).map((rate, i) => {
		const below = i > 0 ? rates[i - 1] : null;
		const above = i < rates.length - 1 ? rates[i + 1] : null;
		const low = below
			? rate.plus(below).div(2)
			: Decimal.max(rate.minus(above!.minus(rate).div(2)), new Decimal('-0.999'));
		const high = above ? rate.plus(above).div(2) : rate.plus(rate.minus(below!).div(2));
		const bracket = {
			low: low.toSignificantDigits(12).toString(),
			high: high.toSignificantDigits(12).toString()
		};
		return (['bisection', 'itp'] as const).map((method) => ({
			method,
			bracket,
			result: solve({
				...request,
				method,
				bracket,
				trace: true,
				stop: { rateTolerance: '1e-12' }
			} as SolveRequest)
		}));
	});
}
