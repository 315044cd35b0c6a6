import Decimal from 'decimal.js';
import type { SolveRequest } from '$lib/schemas/solve';
import { appendixJSchedule } from '../solver/appendix-j';
import { annexISchedule } from '../solver/annex-i';
import { Dec } from '../solver/decimal';
import { datedSchedule, equalPeriodSchedule, evaluateDecimal } from '../solver/npv';
import { evaluateFloat } from '../solver/npv-float';
import type { Schedule } from '../solver/schedule';

function scheduleOf(request: SolveRequest): Schedule {
	switch (request.kind) {
		case 'irr':
			return equalPeriodSchedule(request.flows, request.periodsPerYear ?? 1);
		case 'dated-irr':
			return datedSchedule(request.flows, request.dayCount ?? 'act/365');
		case 'apr-us':
			return appendixJSchedule(request.advances, request.payments).schedule;
		case 'aprc-eu':
			return annexISchedule(request.drawdowns, request.repayments, request.timeBasis ?? 'days');
	}
}

/**
 * NPV at `count` evenly spaced rates from `low` to `high` (in the unit the request is solved in:
 * per period, per unit period or per year), each evaluated in decimal; numbers for plotting.
 */
export function npvProfile(request: SolveRequest, low: string, high: string, count = 81) {
	const schedule = scheduleOf(request);
	// A picture, not a decision: long schedules are plotted with the engine's float64 scan evaluator.
	const precise = schedule.termCount <= 2000;
	const a = new Decimal(low);
	const step = new Decimal(high).minus(a).div(count - 1);
	const points: { rate: number; npv: number }[] = [];
	for (let k = 0; k < count; k++) {
		const rate = a.plus(step.times(k));
		if (rate.lte(-1)) continue;
		points.push({
			rate: rate.toNumber(),
			npv: precise
				? evaluateDecimal(schedule, new Dec(rate)).value.toNumber()
				: evaluateFloat(schedule, Math.log1p(rate.toNumber())).value
		});
	}
	return points;
}

/** A plotting window around the roots: from below the lowest to above the highest. */
export function windowAround(rates: string[]): { low: string; high: string } {
	if (rates.length === 0) return { low: '-0.5', high: '1' };
	const sorted = rates.map((r) => new Decimal(r)).sort((x, y) => x.cmp(y));
	const span = Decimal.max(
		sorted[sorted.length - 1].minus(sorted[0]),
		sorted[0].abs(),
		new Decimal('0.01')
	);
	const low = Decimal.max(sorted[0].minus(span.times(0.6)), new Decimal('-0.95'));
	return { low: low.toString(), high: sorted[sorted.length - 1].plus(span.times(0.6)).toString() };
}
