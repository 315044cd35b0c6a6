// Everything the deal page shows about a set of flows, decided in decimal: every rate with its
// certificate, NPV at the hurdle, MIRR, paybacks, the NPV profile and the trace. Pure; no I/O.
import Decimal from 'decimal.js';
import type { DealContent } from '../../schemas/deal';
import type { SolveRequest, SolveResult } from '../../schemas/solve';
import { solve } from '../solver';
import { Dec } from '../solver/decimal';
import { dayCountTicks, parseDate } from '../solver/day-count';
import { bisectionCount } from '../solver/decimal';
import { datedNpv, datedSchedule, evaluateDecimal, npv } from '../solver/npv';
import { mirr } from '../solver/mirr';
import { npvProfile } from '../solves/profile';
import { traceRunsPerRoot } from '../solves/trace';
import {
	datedDiscountedPayback,
	datedSimplePayback,
	discountedPayback,
	simplePayback
} from './payback';

const D = Decimal.clone({ precision: 40 });

/** Investor-view flows: the borrower view flips every sign. Dated flows sorted; periodic summed per period. */
export function investorFlows(content: DealContent) {
	const flip = content.signConvention === 'borrower';
	const amount = (a: string) => (flip ? new D(a).neg() : new D(a));
	if (content.mode === 'dated') {
		const flows = content.flows
			.map((f) => ({ date: f.date!, amount: amount(f.amount) }))
			.sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
		return {
			mode: 'dated' as const,
			dated: flows.map((f) => ({ date: f.date, amount: f.amount.toString() })),
			periodic: [] as string[]
		};
	}
	const last = Math.max(...content.flows.map((f) => f.period ?? 0));
	const sums = Array.from({ length: last + 1 }, () => new D(0));
	for (const f of content.flows) sums[f.period ?? 0] = sums[f.period ?? 0].plus(amount(f.amount));
	return { mode: 'periodic' as const, dated: [], periodic: sums.map((s) => s.toString()) };
}

const fraction = (percent: string) => new D(percent).div(100);
/** The per-period rate equivalent to an effective annual rate: (1 + R)^(1/m) − 1. */
const perPeriod = (annual: Decimal, m: number) => annual.plus(1).pow(new D(1).div(m)).minus(1);

export function solveRequestFor(content: DealContent): SolveRequest {
	const flows = investorFlows(content);
	// An optional search range, typed in % per year: the engine then works inside that bracket only.
	const bracket =
		content.scanLow !== '' && content.scanHigh !== ''
			? flows.mode === 'dated'
				? { low: fraction(content.scanLow).toString(), high: fraction(content.scanHigh).toString() }
				: {
						low: perPeriod(fraction(content.scanLow), content.periodsPerYear).toString(),
						high: perPeriod(fraction(content.scanHigh), content.periodsPerYear).toString()
					}
			: undefined;
	const stop = {
		rateTolerance: content.rateTolerance,
		maxIterations: content.maxIterations,
		combine: content.combine,
		...(content.residualTolerance ? { residualTolerance: content.residualTolerance } : {})
	};
	return flows.mode === 'dated'
		? {
				kind: 'dated-irr',
				flows: flows.dated,
				dayCount: content.dayCount,
				method: content.method,
				...(bracket ? { bracket } : {}),
				stop,
				trace: true
			}
		: {
				kind: 'irr',
				flows: flows.periodic,
				periodsPerYear: content.periodsPerYear,
				method: content.method,
				...(bracket ? { bracket } : {}),
				stop,
				trace: true
			};
}

/**
 * Dated MIRR: outflows discounted at the finance rate to the first date, inflows compounded at
 * the reinvestment rate to the last; (FV / −PV)^(1/T) − 1 with T in years of the day count.
 * Effective annual. Present values through the engine's decimal evaluator.
 */
function datedMirr(
	flows: { date: string; amount: string }[],
	finance: Decimal,
	reinvest: Decimal,
	dayCount: DealContent['dayCount']
) {
	const basis = dayCountTicks(dayCount);
	const start = parseDate(flows[0].date);
	const total = new D(basis.ticks(start, parseDate(flows[flows.length - 1].date))).div(
		basis.ticksPerYear
	);
	if (total.lte(0)) return null;
	const outflows = flows.filter((f) => f.amount.startsWith('-'));
	const inflows = flows.filter((f) => !f.amount.startsWith('-') && !new D(f.amount).isZero());
	if (!outflows.length || !inflows.length) return null;
	// Anchor both sets at the first date so that time is measured from the same origin.
	const anchor = { date: flows[0].date, amount: '0' };
	const pv = evaluateDecimal(
		datedSchedule([anchor, ...outflows], dayCount),
		new Dec(finance)
	).value;
	const pvIn = evaluateDecimal(
		datedSchedule([anchor, ...inflows], dayCount),
		new Dec(reinvest)
	).value;
	const fv = new D(pvIn).times(reinvest.plus(1).pow(total));
	return fv.div(new D(pv).neg()).pow(new D(1).div(total)).minus(1).toString();
}

export type DealAnalysis = ReturnType<typeof analyseDeal>;

/** `traces: false` skips the per-root textbook runs (the page asks for them separately on long schedules). */
export function analyseDeal(content: DealContent, options: { traces?: boolean } = {}) {
	const flows = investorFlows(content);
	const request = solveRequestFor(content);
	const result: SolveResult = solve(request);
	const m = content.periodsPerYear;
	const hurdle = fraction(content.hurdleRate);
	const finance = fraction(content.financeRate);
	const reinvest = fraction(content.reinvestRate);
	const rates = result.roots.map((root) => {
		if (flows.mode === 'dated')
			return { effectiveAnnual: root.rate, certificate: root.certificate };
		const r = new D(root.rate);
		return {
			perPeriod: root.rate,
			nominalAnnual: r.times(m).toString(),
			effectiveAnnual: r.plus(1).pow(m).minus(1).toString(),
			certificate: root.certificate
		};
	});
	let npvAtHurdle: string;
	let mirrAnnual: string | null;
	let payback;
	if (flows.mode === 'dated') {
		npvAtHurdle = datedNpv(flows.dated, hurdle.toString(), content.dayCount);
		mirrAnnual =
			flows.dated.length > 1 ? datedMirr(flows.dated, finance, reinvest, content.dayCount) : null;
		payback = {
			simple: datedSimplePayback(flows.dated),
			discounted: datedDiscountedPayback(flows.dated, hurdle.toString())
		};
	} else {
		const h = perPeriod(hurdle, m);
		npvAtHurdle = npv(flows.periodic, h.toString());
		const perPeriodMirr = mirr(
			flows.periodic,
			perPeriod(finance, m).toString(),
			perPeriod(reinvest, m).toString()
		);
		mirrAnnual =
			perPeriodMirr === null ? null : new D(perPeriodMirr).plus(1).pow(m).minus(1).toString();
		payback = {
			simple: simplePayback(flows.periodic),
			discounted: discountedPayback(flows.periodic, h.toString())
		};
	}
	// The chart's range is typed in % per year; in periodic mode plot per-period rates.
	let low =
		flows.mode === 'dated'
			? fraction(content.profileLow)
			: perPeriod(fraction(content.profileLow), m);
	let high =
		flows.mode === 'dated'
			? fraction(content.profileHigh)
			: perPeriod(fraction(content.profileHigh), m);
	// Widen the chart to show every root (the analyst's range is kept where it already does).
	for (const root of result.roots) {
		const r = new D(root.rate);
		const margin = D.max(r.abs().times(0.2), new D('0.02'));
		if (r.minus(margin).lt(low)) low = D.max(r.minus(margin), new D('-0.99'));
		if (r.plus(margin).gt(high)) high = r.plus(margin);
	}
	const profile = npvProfile(request, low.toString(), high.toString(), 121);
	const predictedForRange = bisectionCount(
		new Dec(high.minus(low)),
		new Dec(content.rateTolerance)
	);
	const traces = (options.traces === false ? [] : traceRunsPerRoot(request, result)).map((runs) =>
		runs.map((run) => ({
			method: run.method,
			bracket: run.bracket,
			iterations: run.result.iterations,
			predicted: run.result.predictedIterations,
			bound: run.result.roots[0]?.iterationBound ?? null,
			stoppedBy: run.result.stoppedBy,
			steps: (run.result.trace ?? []).filter((s) => s.root === 0)
		}))
	);
	return {
		traces,
		tracesSkipped: options.traces === false && result.roots.length > 0,
		mode: flows.mode,
		flowCount: flows.mode === 'dated' ? flows.dated.length : flows.periodic.length,
		result,
		rates,
		hurdleInUnit: flows.mode === 'dated' ? hurdle.toString() : perPeriod(hurdle, m).toString(),
		npvAtHurdle,
		mirrAnnual,
		payback,
		profile,
		predictedForRange,
		rateUnit: flows.mode === 'dated' ? 'rate per year (effective)' : `rate per period (${m} a year)`
	};
}
