import { Dec, ONE, UNIT_ROUNDOFF, ZERO, powerOfTen, toPlain } from './decimal';
import { dayCountTicks, parseDate, type DayCount } from './day-count';
import { evaluateFloat } from './npv-float';
import { buildSchedule, type Schedule } from './schedule';

/** A decimal NPV and a bound on its rounding error: |true value − value| ≤ bound. */
export interface DecimalValue {
	value: Dec;
	bound: Dec;
}

/** Closed-form runs are used only while 1 − w is not tiny; below this, plain Horner steps. */
const RUN_CANCELLATION_LIMIT = new Dec('1e-6');

/**
 * NPV of the schedule at rate x (per unit of the schedule), in decimal: Horner's rule over the
 * distinct ticks with one cached power of the per-tick discount factor per distinct gap, and
 * closed-form sums for runs of equal coefficients. One fractional power per evaluation (none
 * when a tick is a whole unit). Requires 1 + x > 0.
 */
export function evaluateDecimal(schedule: Schedule, x: Dec): DecimalValue {
	const onePlus = ONE.plus(x);
	const n = schedule.ticksPerUnit;
	const v = n === 1 ? ONE.div(onePlus) : onePlus.ln().div(n).neg().exp();
	const powers = new Map<number, Dec>();
	const power = (exponent: number): Dec => {
		if (exponent === 0) return ONE;
		if (exponent === 1) return v;
		let cached = powers.get(exponent);
		if (!cached) {
			cached = v.pow(exponent);
			powers.set(exponent, cached);
		}
		return cached;
	};
	let total = ZERO;
	for (const group of schedule.groups) {
		let sum: Dec | null = null;
		let base = 0;
		for (let p = group.pieces.length - 1; p >= 0; p -= 1) {
			const piece = group.pieces[p];
			if (piece.kind === 'single') {
				sum =
					sum === null
						? piece.coefficient
						: sum.times(power(base - piece.tick)).plus(piece.coefficient);
				base = piece.tick;
				continue;
			}
			const w = power(piece.gap);
			const oneMinusW = ONE.minus(w);
			let runSum: Dec;
			if (oneMinusW.abs().lt(RUN_CANCELLATION_LIMIT)) {
				runSum = piece.coefficient;
				for (let k = 1; k < piece.count; k += 1) runSum = runSum.times(w).plus(piece.coefficient);
			} else {
				runSum = piece.coefficient.times(ONE.minus(power(piece.gap * piece.count))).div(oneMinusW);
			}
			sum = sum === null ? runSum : sum.times(power(base - piece.firstTick)).plus(runSum);
			base = piece.firstTick;
		}
		if (sum === null) continue;
		let present = base === 0 ? sum : sum.times(power(base));
		if (!group.fraction.isZero()) present = present.div(ONE.plus(group.fraction.times(x)));
		total = total.plus(present);
	}
	return { value: total, bound: roundingBound(schedule, x) };
}

/**
 * A generous bound on the decimal evaluation's rounding error, from a float64 estimate of the
 * gross present value Σ|terms|: each operation, each power (error grows with the exponent) and
 * each closed-form run (amplified by 1/|1 − w|) contributes a multiple of the unit roundoff.
 */
function roundingBound(schedule: Schedule, x: Dec): Dec {
	const xf = x.toNumber();
	const y = xf > -0.999 ? Math.log1p(xf) : ONE.plus(x).ln().toNumber();
	const estimate = evaluateFloat(schedule, y);
	const lnGross = Math.log(estimate.gross) + estimate.logScale;
	let amplification = 0;
	let pieces = 0;
	for (const group of schedule.groups) {
		pieces += group.pieces.length;
		for (const piece of group.pieces) {
			if (piece.kind !== 'run') continue;
			const w = Math.exp((-y * piece.gap) / schedule.ticksPerUnit);
			const gapLog = Math.log2(piece.gap * piece.count + 1);
			amplification += ((piece.count + 1) * (2 * gapLog + 4)) / Math.max(Math.abs(1 - w), 1e-6);
		}
	}
	const steps = schedule.termCount + pieces + 2 * schedule.maxTicks + 64 + amplification;
	const lnBound = lnGross + Math.log(16 * steps * UNIT_ROUNDOFF);
	return powerOfTen(lnBound / Math.LN10 + 1);
}

/** Schedule for equal periods: flow k at period k, rate per period. */
export function equalPeriodSchedule(flows: readonly string[], periodsPerYear = 1): Schedule {
	const terms = flows.map((amount, ticks) => ({ ticks, amount: new Dec(amount) }));
	return buildSchedule(terms, 1, periodsPerYear);
}

export interface DatedFlow {
	date: string;
	amount: string;
}

/** Schedule for dated flows, time from the first flow's date, rate effective annual. */
export function datedSchedule(
	flows: readonly DatedFlow[],
	dayCount: DayCount = 'act/365'
): Schedule {
	const basis = dayCountTicks(dayCount);
	const start = parseDate(flows[0].date);
	const terms = flows.map((flow) => ({
		ticks: basis.ticks(start, parseDate(flow.date)),
		amount: new Dec(flow.amount)
	}));
	return buildSchedule(terms, basis.ticksPerYear, 1);
}

function checkedRate(rate: string): Dec {
	const x = new Dec(rate);
	if (!x.gt(-1)) throw new RangeError(`rate ${rate} must be above -1 (−100%)`);
	return x;
}

/** NPV of equal-period flows (first at period 0) at `rate` per period, as a decimal string. */
export function npv(flows: readonly string[], rate: string): string {
	if (flows.length === 0) return '0';
	return toPlain(evaluateDecimal(equalPeriodSchedule(flows), checkedRate(rate)).value);
}

/** NPV of dated flows at an effective annual `rate`, time measured from the first flow's date. */
export function datedNpv(
	flows: readonly DatedFlow[],
	rate: string,
	dayCount: DayCount = 'act/365'
): string {
	if (flows.length === 0) return '0';
	return toPlain(evaluateDecimal(datedSchedule(flows, dayCount), checkedRate(rate)).value);
}
