/*
 * Payback: when the running total of a deal's flows, plain or discounted, turns from negative
 * to zero or above, in exact decimals.
 *
 * Definition (common practice): the FIRST such crossing. The running total may fall below zero
 * again later (a non-conventional deal with a late outlay); `staysRecovered` says whether it
 * does, and the payback is still the first crossing.
 *
 * Within the span where the crossing happens, that span's flow is taken to arrive evenly, so
 * the moment is interpolated linearly: with C the running total before the span and f the
 * span's (discounted) flow, the crossing lies a fraction −C / f of the way through the span.
 */

import { Dec, ONE, ZERO, toPlain } from '../solver/decimal';
import { dayNumber, fromDayNumber, parseDate } from '../solver/day-count';

export interface DatedAmount {
	/** YYYY-MM-DD. */
	date: string;
	/** Decimal string, negative for money out. */
	amount: string;
}

export type PaybackShortfall = 'no-flows' | 'no-outlay' | 'not-recovered';

interface NotReached {
	reached: false;
	reason: PaybackShortfall;
	message: string;
	/** Running total after the last flow (discounted for discounted payback). */
	finalCumulative: string;
}

interface Reached {
	reached: true;
	/** Index of the flow whose span holds the crossing (its period, for periodic flows). */
	crossingIndex: number;
	/** False when the running total falls below zero again after the crossing. */
	staysRecovered: boolean;
	finalCumulative: string;
}

export type PaybackResult = (Reached & { period: string }) | NotReached;

export type DatedPaybackResult =
	| (Reached & {
			/** Years (act/365) from the first flow's date to the crossing. */
			years: string;
			/** First whole day on or after the interpolated crossing. */
			date: string;
	  })
	| NotReached;

interface Crossing {
	index: number;
	/** Fraction of the crossing span elapsed at the crossing, in [0, 1]. */
	fraction: Dec;
	staysRecovered: boolean;
	total: Dec;
}

function firstCrossing(values: readonly Dec[], what: string): Crossing | NotReached {
	let cumulative = ZERO;
	let everNegative = false;
	let found: { index: number; fraction: Dec } | null = null;
	let staysRecovered = true;
	for (const [index, value] of values.entries()) {
		const previous = cumulative;
		cumulative = cumulative.plus(value);
		// previous < 0 ≤ cumulative implies value > 0, so the division is safe.
		if (!found && previous.lt(0) && cumulative.gte(0)) {
			found = { index, fraction: previous.neg().div(value) };
		}
		if (cumulative.lt(0)) {
			everNegative = true;
			if (found) staysRecovered = false;
		}
	}
	const finalCumulative = toPlain(cumulative);
	if (values.length === 0) {
		return { reached: false, reason: 'no-flows', message: 'There are no flows.', finalCumulative };
	}
	if (found === null) {
		return everNegative
			? {
					reached: false,
					reason: 'not-recovered',
					message: `The ${what} is still negative (${finalCumulative}) after the last flow.`,
					finalCumulative
				}
			: {
					reached: false,
					reason: 'no-outlay',
					message: `The ${what} is never negative, so there is nothing to pay back.`,
					finalCumulative
				};
	}
	const { index, fraction } = found;
	return { index, fraction, staysRecovered, total: cumulative };
}

function checkedRate(rate: string): Dec {
	const value = new Dec(rate);
	if (!value.gt(-1)) throw new RangeError(`rate ${rate} must be above -1 (−100%)`);
	return value;
}

function periodic(values: Dec[], what: string): PaybackResult {
	const crossing = firstCrossing(values, what);
	if ('reached' in crossing) return crossing;
	return {
		reached: true,
		period: toPlain(new Dec(crossing.index - 1).plus(crossing.fraction)),
		crossingIndex: crossing.index,
		staysRecovered: crossing.staysRecovered,
		finalCumulative: toPlain(crossing.total)
	};
}

/**
 * Payback of equal-period flows (first at period 0), in periods, as a decimal string:
 * the first crossing of the running total from negative to ≥ 0, interpolated linearly.
 */
export function simplePayback(flows: readonly string[]): PaybackResult {
	return periodic(
		flows.map((amount) => new Dec(amount)),
		'cumulative cash flow'
	);
}

/**
 * Discounted payback of equal-period flows (first at period 0), in periods: flow k is divided
 * by (1 + ratePerPeriod)^k (rate a fraction per period, above −1), then as simplePayback.
 */
export function discountedPayback(flows: readonly string[], ratePerPeriod: string): PaybackResult {
	const growth = ONE.plus(checkedRate(ratePerPeriod));
	let factor = ONE;
	const values = flows.map((amount) => {
		const present = new Dec(amount).div(factor);
		factor = factor.times(growth);
		return present;
	});
	return periodic(values, 'cumulative discounted cash flow');
}

/** Days from the first date for each flow; throws unless dates are valid and ascending. */
function dayOffsets(flows: readonly DatedAmount[]): number[] {
	const days = flows.map((flow) => {
		const date = parseDate(flow.date);
		const back = fromDayNumber(dayNumber(date));
		const valid =
			/^\d{4}-\d{2}-\d{2}$/.test(flow.date) &&
			back.year === date.year &&
			back.month === date.month &&
			back.day === date.day;
		if (!valid) throw new RangeError(`${flow.date} is not a date written YYYY-MM-DD`);
		return dayNumber(date);
	});
	days.forEach((day, i) => {
		if (i > 0 && day < days[i - 1]) {
			throw new RangeError(`flow ${i} (${flows[i].date}) comes before flow ${i - 1}`);
		}
	});
	return days.map((day) => day - days[0]);
}

function dated(
	flows: readonly DatedAmount[],
	days: number[],
	values: Dec[],
	what: string
): DatedPaybackResult {
	const crossing = firstCrossing(values, what);
	if ('reached' in crossing) return crossing;
	const { index, fraction } = crossing;
	const before = new Dec(days[index - 1]);
	const elapsed = before.plus(new Dec(days[index]).minus(before).times(fraction));
	const start = dayNumber(parseDate(flows[0].date));
	const day = fromDayNumber(start + elapsed.ceil().toNumber());
	const pad = (n: number) => String(n).padStart(2, '0');
	return {
		reached: true,
		years: toPlain(elapsed.div(365)),
		date: `${String(day.year).padStart(4, '0')}-${pad(day.month)}-${pad(day.day)}`,
		crossingIndex: index,
		staysRecovered: crossing.staysRecovered,
		finalCumulative: toPlain(crossing.total)
	};
}

/**
 * Payback of dated flows (ascending dates), in years act/365 from the first date, with the
 * crossing interpolated linearly in time between the two flows around it.
 */
export function datedSimplePayback(flows: readonly DatedAmount[]): DatedPaybackResult {
	const days = dayOffsets(flows);
	const values = flows.map((flow) => new Dec(flow.amount));
	return dated(flows, days, values, 'cumulative cash flow');
}

/**
 * Discounted payback of dated flows, in years act/365 from the first date: each flow is
 * divided by (1 + annualRate)^(days / 365), the rate an effective annual fraction above −1.
 */
export function datedDiscountedPayback(
	flows: readonly DatedAmount[],
	annualRate: string
): DatedPaybackResult {
	const growth = ONE.plus(checkedRate(annualRate));
	const days = dayOffsets(flows);
	// One fractional power (the daily factor), then integer powers cached per distinct day count:
	// the same value as growth^(days/365) for each flow, without a fractional power per flow.
	const daily = growth.ln().div(365).exp();
	const factors = new Map<number, Dec>();
	const values = flows.map((flow, i) => {
		let factor = factors.get(days[i]);
		if (!factor) {
			// Whole years exactly; other spans through the daily factor.
			factor = days[i] % 365 === 0 ? growth.pow(days[i] / 365) : daily.pow(days[i]);
			factors.set(days[i], factor);
		}
		return new Dec(flow.amount).div(factor);
	});
	return dated(flows, days, values, 'cumulative discounted cash flow');
}
