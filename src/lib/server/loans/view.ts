// What the loan page shows, computed from a stored version: figures, disclosure facts, trace.
import type { SolveRequest, SolveResult } from '$lib/schemas/solve';
import { npvProfile, windowAround } from '../solves/profile';
import { traceRuns } from '../solves/trace';
import { correctDecimals } from './disclosure';
import { flowTimes } from './export';
import { figuresOf, headerOf, type LoanFile } from './file';
import { groupPayments } from './schedule';

export function loanView(
	file: LoanFile,
	solve: {
		request: unknown;
		result: SolveResult;
		engineVersion: string;
		createdAt: Date;
		id: string;
	} | null
) {
	const figures = figuresOf(file);
	const header = headerOf(file);
	const result = solve?.result ?? null;
	const runs = solve && result ? traceRuns(solve.request as SolveRequest, result) : null;
	const times = figures.advances.length && figures.payments.length ? flowTimes(file, figures) : [];
	const firstPayment = times.find((t) => t.kind === 'payment') ?? null;
	const roots = result?.roots ?? [];
	const solvedUnit = (root: (typeof roots)[number]) => root.ratePerPeriod ?? root.rate;
	const window = windowAround(roots.map(solvedUnit));
	const profile =
		solve && result && figures.payments.length && figures.advances.length
			? {
					points: npvProfile(solve.request as SolveRequest, window.low, window.high),
					roots: roots.map((root) => ({
						rate: Number(solvedUnit(root)),
						low: Number(root.certificate.low),
						high: Number(root.certificate.high)
					}))
				}
			: null;
	return {
		header,
		entryMode: file.entryMode,
		figures,
		groups: groupPayments(figures.payments),
		result,
		solveMeta: solve
			? { id: solve.id, engineVersion: solve.engineVersion, createdAt: solve.createdAt }
			: null,
		digits: result ? correctDecimals(result) : null,
		profile,
		firstPeriod: firstPayment && {
			t: firstPayment.t,
			f: firstPayment.fText,
			date: firstPayment.date
		},
		trace:
			runs?.map((run) => ({
				method: run.method,
				bracket: run.bracket,
				iterations: run.result.iterations,
				predicted: run.result.predictedIterations,
				bound: run.result.roots[0]?.iterationBound ?? null,
				stoppedBy: run.result.stoppedBy,
				steps: (run.result.trace ?? []).map((s) => ({
					iteration: s.iteration,
					low: s.low,
					high: s.high,
					point: s.point,
					value: s.value
				}))
			})) ?? null
	};
}
