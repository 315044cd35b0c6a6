/** Calendar arithmetic on `YYYY-MM-DD` dates, in whole days (no time zones involved). */

import { daysInMonth, isLeapYear, readIsoDate, type CalendarDate } from '../../calendar';

export { daysInMonth, isLeapYear, type CalendarDate };

const MS_PER_DAY = 86_400_000;

/** Year, month and day of a `YYYY-MM-DD` date (the request schema has checked the form). */
export function parseDate(text: string): CalendarDate {
	const read = readIsoDate(text);
	if (read) return read;
	const [year, month, day] = text.split('-').map(Number);
	return { year, month, day };
}

export function isMonthEnd(date: CalendarDate): boolean {
	return date.day === daysInMonth(date.year, date.month);
}

/** Days since 1970-01-01 (negative before), by the proleptic Gregorian calendar. */
export function dayNumber(date: CalendarDate): number {
	// Count from 1 March so that the leap day ends the year (days-from-civil arithmetic).
	const year = date.month <= 2 ? date.year - 1 : date.year;
	const era = Math.floor(year / 400);
	const yearOfEra = year - era * 400;
	const shifted = date.month > 2 ? date.month - 3 : date.month + 9;
	const dayOfYear = Math.floor((153 * shifted + 2) / 5) + date.day - 1;
	const dayOfEra =
		yearOfEra * 365 + Math.floor(yearOfEra / 4) - Math.floor(yearOfEra / 100) + dayOfYear;
	return era * 146_097 + dayOfEra - 719_468;
}

export function fromDayNumber(days: number): CalendarDate {
	const d = new Date(days * MS_PER_DAY);
	return { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate() };
}

export function daysBetween(earlier: CalendarDate, later: CalendarDate): number {
	return dayNumber(later) - dayNumber(earlier);
}

/**
 * The date `months` whole months before `date`, keeping the day of month `nominalDay`
 * (clamped to the month's last day, so the 29th, 30th or 31st fall on the end of February).
 */
export function monthsBack(date: CalendarDate, months: number, nominalDay: number): CalendarDate {
	const index = date.year * 12 + (date.month - 1) - months;
	const year = Math.floor(index / 12);
	const month = index - year * 12 + 1;
	return { year, month, day: Math.min(nominalDay, daysInMonth(year, month)) };
}

/**
 * Whole months counted back from `later` towards `earlier`, and the days left over between
 * `earlier` and the last month boundary reached.
 */
export function wholeMonthsBack(
	earlier: CalendarDate,
	later: CalendarDate,
	nominalDay: number
): { months: number; remainderDays: number; boundary: CalendarDate } {
	const start = dayNumber(earlier);
	// A boundary in earlier's own month or later: one more month back always falls before it.
	let months = Math.max(0, (later.year - earlier.year) * 12 + (later.month - earlier.month));
	while (months > 0 && dayNumber(monthsBack(later, months, nominalDay)) < start) months -= 1;
	const boundary = months === 0 ? later : monthsBack(later, months, nominalDay);
	return { months, remainderDays: dayNumber(boundary) - start, boundary };
}

/** Ticks per year for the act/act count: one day is 366 ticks in a 365-day year, 365 in a leap year. */
export const ACT_ACT_TICKS_PER_YEAR = 365 * 366;

/**
 * Time from `start` to `end` on the act/act basis, in ticks of 1/(365·366) year: every day counts
 * 1/365 of a year in an ordinary calendar year and 1/366 in a leap year, so a span crossing
 * 1 January is split at the year boundary.
 */
export function actActTicks(start: CalendarDate, end: CalendarDate): number {
	let ticks = 0;
	let from = dayNumber(start);
	const to = dayNumber(end);
	for (let year = start.year; from < to; year += 1) {
		const nextYear = dayNumber({ year: year + 1, month: 1, day: 1 });
		const upTo = Math.min(nextYear, to);
		ticks += (upTo - from) * (isLeapYear(year) ? 365 : 366);
		from = upTo;
	}
	return ticks;
}

export type DayCount = 'act/365' | 'act/360' | 'act/act';

/** Ticks per year and a tick counter for a dated day-count basis. */
export function dayCountTicks(dayCount: DayCount): {
	ticksPerYear: number;
	ticks: (start: CalendarDate, end: CalendarDate) => number;
} {
	if (dayCount === 'act/act') return { ticksPerYear: ACT_ACT_TICKS_PER_YEAR, ticks: actActTicks };
	return { ticksPerYear: dayCount === 'act/360' ? 360 : 365, ticks: daysBetween };
}
