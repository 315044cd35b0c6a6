import type {
	NoRootReason,
	RootReport,
	SolveRequest,
	SolveResult,
	TraceStep
} from '../../schemas/solve';
import { annexISchedule } from './annex-i';
import { appendixJSchedule } from './appendix-j';
import { describeUnit } from './unit-period';
import { Dec, percentHalfUp, toPlain } from './decimal';
import { datedSchedule, equalPeriodSchedule } from './npv';
import { findRoots, type FoundRoot, type RootSearch } from './root-finder';
import type { Schedule } from './schedule';
import { resolveStopRules } from './stop-rules';
import { regularity } from './tolerance';

/** How one kind of request becomes an equation, and how its solved variable is reported. */
interface Equation {
	schedule: Schedule;
	rateBasis: string;
	/** Headline rate from the solved variable (identity, or × unit periods per year). */
	headline: (x: Dec) => Dec;
	describe: (x: Dec) => string;
	perPeriod: boolean;
	extra: Partial<SolveResult>;
	disclosurePlaces?: number;
}

const percent = (x: Dec) => `${x.times(100).toSignificantDigits(8).toString()}%`;

function equationOf(request: SolveRequest): Equation {
	const identity = (x: Dec) => x;
	switch (request.kind) {
		case 'irr':
			return {
				schedule: equalPeriodSchedule(request.flows, request.periodsPerYear ?? 1),
				rateBasis: 'per period',
				headline: identity,
				describe: (x) => `${percent(x)} per period`,
				perPeriod: true,
				extra: {}
			};
		case 'dated-irr':
			return {
				schedule: datedSchedule(request.flows, request.dayCount ?? 'act/365'),
				rateBasis: `effective annual (${request.dayCount ?? 'act/365'})`,
				headline: identity,
				describe: (x) => `${percent(x)} a year`,
				perPeriod: false,
				extra: {}
			};
		case 'apr-us': {
			const { schedule, unit, perYear } = appendixJSchedule(request.advances, request.payments);
			const label = describeUnit(unit);
			return {
				schedule,
				rateBasis: `nominal annual: rate per unit period (${label.label}) × ${toPlain(perYear)}`,
				headline: (x) => x.times(perYear),
				describe: (x) => `APR ${percent(x.times(perYear))} (${percent(x)} per ${label.label})`,
				perPeriod: true,
				extra: {
					unitPeriod: label,
					unitPeriodsPerYear: toPlain(perYear),
					regularity: regularity(request)
				},
				disclosurePlaces: 2
			};
		}
		case 'aprc-eu': {
			const basis = request.timeBasis ?? 'days';
			return {
				schedule: annexISchedule(request.drawdowns, request.repayments, basis),
				rateBasis: `effective annual (Annex I, ${basis} basis)`,
				headline: identity,
				describe: (x) => `APRC ${percent(x)}`,
				perPeriod: false,
				extra: {},
				disclosurePlaces: 1
			};
		}
	}
}

function reasonFor(search: RootSearch, equation: Equation): NoRootReason | undefined {
	const noRoot = search.noRoot;
	if (!noRoot) return undefined;
	const closest = noRoot.closest
		? { rate: toPlain(equation.headline(noRoot.closest.rate)), npv: toPlain(noRoot.closest.npv) }
		: undefined;
	const near = noRoot.closest
		? ` Its smallest magnitude found is ${noRoot.closest.npv.abs().toSignificantDigits(6)} at ${equation.describe(noRoot.closest.rate)}.`
		: '';
	const touching = search.warnings.some((w) => w.code === 'touching-root-suspected')
		? ' See the warnings: a touching root is suspected.'
		: '';
	const sign = search.uniqueness.finalSum.startsWith('-') ? 'negative' : 'positive';
	const messages: Record<NoRootReason['code'], string> = {
		'all-zero':
			'Every flow is zero, or the flows cancel at every date: NPV is zero at every rate, so no rate is determined.',
		'one-sign': `All flows are ${sign} (none of the other sign), so NPV never reaches zero: no rate exists.`,
		'no-sign-change': `NPV never changes sign over the scanned range.${near}${touching}`,
		'bracket-same-sign': `NPV has the same sign at both ends of the bracket and no sign change was found inside it.${near}${touching}`
	};
	return { code: noRoot.code, message: messages[noRoot.code], ...(closest ? { closest } : {}) };
}

function rootReport(root: FoundRoot, equation: Equation): RootReport {
	return {
		rate: toPlain(equation.headline(root.point)),
		...(equation.perPeriod ? { ratePerPeriod: toPlain(root.point) } : {}),
		certificate: { low: toPlain(root.low), high: toPlain(root.high) },
		npvAtLow: toPlain(root.atLow.value),
		npvAtHigh: toPlain(root.atHigh.value),
		errorBound: toPlain(root.errorBound),
		iterations: root.iterations,
		predictedIterations: root.predictedIterations,
		...(root.iterationBound !== undefined ? { iterationBound: root.iterationBound } : {}),
		stoppedBy: root.stoppedBy,
		seeded: root.seeded
	};
}

/**
 * Solves a schema-valid request: every root bracketed by a sign change, certified and refined in
 * decimal. The headline rate is set only when exactly one root was found.
 */
export function solve(request: SolveRequest): SolveResult {
	const rules = resolveStopRules(request.stop);
	const method = request.method ?? 'bisection';
	const equation = equationOf(request);
	const search = findRoots(equation.schedule, {
		method,
		rules,
		trace: request.trace === true,
		describe: equation.describe,
		bracket: request.bracket
			? { low: new Dec(request.bracket.low), high: new Dec(request.bracket.high) }
			: undefined
	});
	const warnings = [...search.warnings];
	if (rules.rateTolerance === null) {
		warnings.push({
			code: 'residual-rule-alone',
			message:
				'Only the residual rule (|NPV| at most the residual tolerance) stops refinement; on a flat NPV it can stop far from the root. Each root reports its certificate width and error bound.'
		});
	}
	const roots = search.roots;
	const solved = roots.length === 1;
	const status = solved ? 'solved' : roots.length > 1 ? 'multiple-roots' : 'no-root';
	const only = solved ? roots[0] : null;
	let disclosed: string | null | undefined;
	if (equation.disclosurePlaces !== undefined) {
		disclosed = null;
		if (only) {
			const places = equation.disclosurePlaces;
			disclosed = percentHalfUp(equation.headline(only.point), places);
			const low = percentHalfUp(equation.headline(only.low), places);
			const high = percentHalfUp(equation.headline(only.high), places);
			if (low !== high) {
				warnings.push({
					code: 'disclosure-undecided',
					message: `The certificate straddles a rounding boundary (${low}% to ${high}%); tighten the rate tolerance to decide the disclosed figure.`
				});
			}
		}
	}
	const stopped = roots.map((r) => r.stoppedBy);
	const result: SolveResult = {
		kind: request.kind,
		status,
		rate: only ? toPlain(equation.headline(only.point)) : null,
		rateBasis: equation.rateBasis,
		...(equation.perPeriod ? { ratePerPeriod: only ? toPlain(only.point) : null } : {}),
		...equation.extra,
		...(disclosed !== undefined ? { disclosed } : {}),
		roots: roots.map((root) => rootReport(root, equation)),
		iterations: roots.reduce((sum, r) => sum + r.iterations, 0),
		predictedIterations: roots.some((r) => r.predictedIterations === null)
			? null
			: roots.reduce((sum, r) => sum + (r.predictedIterations ?? 0), 0),
		stoppedBy:
			stopped.length === 0
				? 'no-bracket'
				: ((['iteration-cap', 'precision-limit'] as const).find((s) => stopped.includes(s)) ??
					stopped[0]),
		method,
		uniqueness: search.uniqueness,
		warnings,
		scan: search.scan
	};
	const reason = reasonFor(search, equation);
	if (reason) result.reason = reason;
	if (request.trace) {
		result.trace = roots.flatMap((root, index): TraceStep[] =>
			root.trace.map((step) => ({
				root: index,
				iteration: step.iteration,
				low: toPlain(step.low),
				high: toPlain(step.high),
				point: toPlain(step.point),
				value: toPlain(step.value)
			}))
		);
	}
	return result;
}
