import {
	ACT_ACT_TICKS_PER_YEAR,
	actActTicks,
	isMonthEnd,
	parseDate,
	wholeMonthsBack,
	type CalendarDate
} from './day-count';
import { Dec } from './decimal';
import { buildSchedule, type Schedule, type ScheduleTerm } from './schedule';

/**
 * Directive 2008/48/EC Annex I: drawdowns on one side, repayments and charges on the other, time
 * in years from the first drawdown, X the effective annual APRC.
 *
 * `days`: a year has 365 days, or 366 in a leap year. A span crossing 1 January is split there:
 * each day counts 1/365 of a year in an ordinary calendar year and 1/366 in a leap year, so that
 * whole calendar years count exactly 1 (ticks of 1/(365·366) year keep this exact).
 *
 * `periods`: whole years, then whole months (1/12), then whole weeks (1/52), counted back from
 * each date towards the first drawdown, and the days left over over 365 (ticks of 1/56940 year,
 * the least common multiple of 12, 52 and 365, keep this exact). Months keep the day of month
 * (clamped to the month's end); month-end dates count to month ends when the first drawdown is
 * also on a month end.
 */
export type TimeBasis = 'days' | 'periods';

export const PERIOD_TICKS_PER_YEAR = 56_940;
const TICKS_PER_MONTH = PERIOD_TICKS_PER_YEAR / 12;
const TICKS_PER_WEEK = PERIOD_TICKS_PER_YEAR / 52;
const TICKS_PER_DAY = PERIOD_TICKS_PER_YEAR / 365;

export interface PeriodCount {
	years: number;
	months: number;
	weeks: number;
	days: number;
}

export function countPeriods(start: CalendarDate, date: CalendarDate): PeriodCount {
	const nominalDay = isMonthEnd(date) && isMonthEnd(start) ? 31 : date.day;
	const back = wholeMonthsBack(start, date, nominalDay);
	return {
		years: Math.floor(back.months / 12),
		months: back.months % 12,
		weeks: Math.floor(back.remainderDays / 7),
		days: back.remainderDays % 7
	};
}

export function periodTicks(start: CalendarDate, date: CalendarDate): number {
	const count = countPeriods(start, date);
	return (
		count.years * PERIOD_TICKS_PER_YEAR +
		count.months * TICKS_PER_MONTH +
		count.weeks * TICKS_PER_WEEK +
		count.days * TICKS_PER_DAY
	);
}

export interface DatedAmount {
	date: string;
	amount: string;
}

/** Drawdowns positive, repayments negative, time from the first drawdown under `basis`. */
export function annexISchedule(
	drawdowns: DatedAmount[],
	repayments: DatedAmount[],
	basis: TimeBasis = 'days'
): Schedule {
	const start = parseDate(drawdowns[0].date);
	const ticks = basis === 'days' ? actActTicks : periodTicks;
	const terms: ScheduleTerm[] = [
		...drawdowns.map((d) => ({
			ticks: ticks(start, parseDate(d.date)),
			amount: new Dec(d.amount)
		})),
		...repayments.map((r) => ({
			ticks: ticks(start, parseDate(r.date)),
			amount: new Dec(r.amount).neg()
		}))
	];
	const perYear = basis === 'days' ? ACT_ACT_TICKS_PER_YEAR : PERIOD_TICKS_PER_YEAR;
	return buildSchedule(terms, perYear, 1);
}
