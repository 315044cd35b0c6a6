import type { UnitPeriodResult } from '../../schemas/solve';
import { Dec } from './decimal';
import {
	daysBetween,
	daysInMonth,
	isMonthEnd,
	monthsBack,
	wholeMonthsBack,
	type CalendarDate
} from './day-count';

/**
 * 12 CFR 1026 Appendix J (b)(3)–(4): periods of a transaction as standard intervals of time, and
 * the unit period chosen from them.
 */
export type UnitPeriod =
	| { kind: 'day' }
	| { kind: 'week'; weeks: number }
	| { kind: 'semimonth' }
	| { kind: 'month'; months: number } // 12 months is the year unit period
	| { kind: 'term'; days: number; months: number | null }; // single advance, single payment < 1 year

export interface DatedAmount {
	date: string;
	amount: string;
}

/** A period between two dates, as a standard interval of time when it is one. */
export type Interval =
	| { kind: 'month'; months: number }
	| { kind: 'semimonth' }
	| { kind: 'week'; weeks: number }
	| { kind: 'day'; days: number };

const DAYS_PER_MONTH = 365 / 12;

/**
 * Day of month a list of dates is scheduled on: 31 for a series on the last day of each month
 * ((b)(3)(iv) month-end rule), otherwise the most common day (the 29th or 30th then fall on
 * the end of February when needed).
 */
export function scheduledDay(dates: readonly CalendarDate[]): number {
	if (dates.length >= 2 && dates.every(isMonthEnd)) return 31;
	const counts = new Map<number, number>();
	for (const date of dates) counts.set(date.day, (counts.get(date.day) ?? 0) + 1);
	let best = dates[0]?.day ?? 1;
	for (const [day, count] of counts) {
		const bestCount = counts.get(best) ?? 0;
		if (count > bestCount || (count === bestCount && day > best)) best = day;
	}
	return best;
}

/** The day to count whole months back from: a clamped month-end stands for the scheduled day. */
export function countingDay(date: CalendarDate, scheduled: number): number {
	return isMonthEnd(date) && scheduled > date.day ? scheduled : date.day;
}

function halfMonthAfter(date: CalendarDate): CalendarDate {
	const { year, month, day } = date;
	if (day <= 15) return { year, month, day: Math.min(day + 15, daysInMonth(year, month)) };
	const next = monthsBack(date, -1, 1);
	return { ...next, day: isMonthEnd(date) ? 15 : day - 15 };
}

export function classifyInterval(
	from: CalendarDate,
	to: CalendarDate,
	scheduled: number
): Interval {
	const nominalDay = countingDay(to, scheduled);
	// Fast path for the common case, same day of month: `from` is then exactly the boundary
	// whole months back from `to`, which is what wholeMonthsBack would find.
	const months = (to.year - from.year) * 12 + (to.month - from.month);
	if (months >= 1 && from.day === to.day && nominalDay === to.day) return { kind: 'month', months };
	const days = daysBetween(from, to);
	const back = wholeMonthsBack(from, to, nominalDay);
	if (back.months >= 1 && back.remainderDays === 0) return { kind: 'month', months: back.months };
	const half = halfMonthAfter(from);
	const sameMonthEnd =
		from.day === 15 && to.year === from.year && to.month === from.month && isMonthEnd(to);
	if (daysBetween(half, to) === 0 || sameMonthEnd) return { kind: 'semimonth' };
	if (days > 0 && days % 7 === 0) return { kind: 'week', weeks: days / 7 };
	return { kind: 'day', days };
}

/** A string that tells intervals apart (the same for equal intervals). */
export function intervalKey(interval: Interval): string {
	switch (interval.kind) {
		case 'month':
			return `month:${interval.months}`;
		case 'week':
			return `week:${interval.weeks}`;
		case 'day':
			return `day:${interval.days}`;
		case 'semimonth':
			return 'semimonth';
	}
}

function approximateDays(interval: Interval): number {
	switch (interval.kind) {
		case 'month':
			return interval.months * DAYS_PER_MONTH;
		case 'semimonth':
			return DAYS_PER_MONTH / 2;
		case 'week':
			return interval.weeks * 7;
		case 'day':
			return interval.days;
	}
}

/** Standard intervals: a day, week, semimonth, month, or multiple of a week or month up to a year. */
function isStandard(interval: Interval): boolean {
	if (interval.kind === 'month') return interval.months <= 12;
	if (interval.kind === 'week') return interval.weeks <= 52;
	if (interval.kind === 'day') return interval.days === 1;
	return true;
}

function toUnit(interval: Interval): UnitPeriod {
	if (interval.kind === 'month') return { kind: 'month', months: interval.months };
	if (interval.kind === 'week') return { kind: 'week', weeks: interval.weeks };
	if (interval.kind === 'semimonth') return { kind: 'semimonth' };
	return { kind: 'day' };
}

/** The standard interval nearest to `days`; when equally near two, the shorter ((b)(4)(i)(B)). */
function nearestStandard(days: number): UnitPeriod {
	const candidates: Interval[] = [{ kind: 'day', days: 1 }, { kind: 'semimonth' }];
	for (let weeks = 1; weeks <= 52; weeks += 1) candidates.push({ kind: 'week', weeks });
	for (let months = 1; months <= 12; months += 1) candidates.push({ kind: 'month', months });
	candidates.sort((p, q) => approximateDays(p) - approximateDays(q));
	let best = candidates[0];
	for (const candidate of candidates) {
		const gap = Math.abs(approximateDays(candidate) - days);
		if (gap < Math.abs(approximateDays(best) - days) - 1e-9) best = candidate;
	}
	return toUnit(best);
}

/** Every period of the transaction ((b)(3)(i)): between advances, between payments, and from the start. */
export function periodsOf(advances: CalendarDate[], payments: CalendarDate[]): Interval[] {
	const periods: Interval[] = [];
	const push = (from: CalendarDate, to: CalendarDate, scheduled: number) => {
		if (daysBetween(from, to) > 0) periods.push(classifyInterval(from, to, scheduled));
	};
	const advanceDay = scheduledDay(advances);
	const paymentDay = scheduledDay(payments);
	for (let k = 1; k < advances.length; k += 1) push(advances[k - 1], advances[k], advanceDay);
	push(advances[0], payments[0], paymentDay);
	for (let k = 1; k < payments.length; k += 1) push(payments[k - 1], payments[k], paymentDay);
	return periods;
}

/**
 * The unit period ((b)(4)): for a single advance repaid by a single payment, the term (at most a
 * year); otherwise the common period occurring most often (ties: the shorter), or, with no common
 * period, the average period rounded to the nearest standard interval.
 */
export function unitPeriodOf(advances: CalendarDate[], payments: CalendarDate[]): UnitPeriod {
	if (advances.length === 1 && payments.length === 1) {
		const back = wholeMonthsBack(advances[0], payments[0], payments[0].day);
		const days = daysBetween(advances[0], payments[0]);
		if (days === 0) return { kind: 'day' };
		if (back.months < 12)
			return { kind: 'term', days, months: back.remainderDays === 0 ? back.months : null };
		return { kind: 'month', months: 12 };
	}
	const periods = periodsOf(advances, payments);
	if (periods.length === 0) return { kind: 'day' };
	const tally = new Map<string, { interval: Interval; count: number }>();
	for (const period of periods) {
		if (!isStandard(period)) continue;
		const key = intervalKey(period);
		const entry = tally.get(key) ?? { interval: period, count: 0 };
		entry.count += 1;
		tally.set(key, entry);
	}
	const common = [...tally.values()].filter((entry) => entry.count > 1);
	if (common.length > 0) {
		common.sort(
			(p, q) => q.count - p.count || approximateDays(p.interval) - approximateDays(q.interval)
		);
		return toUnit(common[0].interval);
	}
	const average =
		periods.reduce((sum, period) => sum + approximateDays(period), 0) / periods.length;
	return nearestStandard(average);
}

/** Unit periods per year ((b)(5)): 12/months, 24, 52/weeks, 365, or from the term. */
export function unitPeriodsPerYear(unit: UnitPeriod): Dec {
	switch (unit.kind) {
		case 'month':
			return new Dec(12).div(unit.months);
		case 'semimonth':
			return new Dec(24);
		case 'week':
			return new Dec(52).div(unit.weeks);
		case 'day':
			return new Dec(365);
		case 'term':
			return unit.months !== null ? new Dec(12).div(unit.months) : new Dec(365).div(unit.days);
	}
}

export function describeUnit(unit: UnitPeriod): UnitPeriodResult {
	switch (unit.kind) {
		case 'day':
			return { kind: 'day', count: 1, label: 'day' };
		case 'week':
			return {
				kind: 'week',
				count: unit.weeks,
				label: unit.weeks === 1 ? 'week' : `${unit.weeks} weeks`
			};
		case 'semimonth':
			return { kind: 'semimonth', count: 1, label: 'semimonth' };
		case 'month':
			if (unit.months === 12) return { kind: 'year', count: 1, label: 'year' };
			return {
				kind: 'month',
				count: unit.months,
				label: unit.months === 1 ? 'month' : `${unit.months} months`
			};
		case 'term':
			return unit.months !== null
				? { kind: 'term', count: unit.months, label: `term of ${unit.months} month(s)` }
				: { kind: 'term', count: unit.days, label: `term of ${unit.days} day(s)` };
	}
}
