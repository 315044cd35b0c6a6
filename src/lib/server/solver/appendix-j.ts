import { Dec } from './decimal';
import {
	daysBetween,
	monthsBack,
	parseDate,
	wholeMonthsBack,
	type CalendarDate
} from './day-count';
import { buildSchedule, type Schedule, type ScheduleTerm } from './schedule';
import {
	countingDay,
	scheduledDay,
	unitPeriodOf,
	unitPeriodsPerYear,
	type DatedAmount,
	type UnitPeriod
} from './unit-period';

/**
 * 12 CFR 1026 Appendix J, actuarial method: whole unit periods t and the fraction f counted back
 * from each date to the beginning of the term (paragraph (b)(5)), and the general equation
 * ((b)(8)) as a schedule; the unit period itself comes from unit-period.ts. The term is taken to
 * begin on the first advance's date.
 */
export interface UnitCount {
	t: number;
	numerator: number;
	denominator: number;
}

/** Whole unit periods t and fraction f from the start of the term to `date` ((b)(5)). */
export function countUnitPeriods(
	start: CalendarDate,
	date: CalendarDate,
	unit: UnitPeriod,
	scheduled: number
): UnitCount {
	const days = daysBetween(start, date);
	const back = wholeMonthsBack(start, date, countingDay(date, scheduled));
	const thirtyDayCount = 30 * back.months + back.remainderDays;
	switch (unit.kind) {
		case 'term':
			return { t: days === 0 ? 0 : 1, numerator: 0, denominator: 1 };
		case 'day':
			return { t: days, numerator: 0, denominator: 1 };
		case 'week': {
			const length = 7 * unit.weeks;
			return { t: Math.floor(days / length), numerator: days % length, denominator: length };
		}
		case 'semimonth':
			return {
				t: Math.floor(thirtyDayCount / 15),
				numerator: thirtyDayCount % 15,
				denominator: 15
			};
		case 'month': {
			if (unit.months === 1)
				return { t: back.months, numerator: back.remainderDays, denominator: 30 };
			if (unit.months < 12) {
				const length = 30 * unit.months;
				return {
					t: Math.floor(thirtyDayCount / length),
					numerator: thirtyDayCount % length,
					denominator: length
				};
			}
			// Year: whole years back, then the rest in months/12 if whole months, else days/365.
			const years = Math.floor(back.months / 12);
			const boundary =
				years === 0 ? date : monthsBack(date, 12 * years, countingDay(date, scheduled));
			const rest = wholeMonthsBack(start, boundary, boundary.day);
			if (rest.remainderDays === 0) return { t: years, numerator: rest.months, denominator: 12 };
			return { t: years, numerator: daysBetween(start, boundary), denominator: 365 };
		}
	}
}

export interface AppendixJSchedule {
	schedule: Schedule;
	unit: UnitPeriod;
	perYear: Dec;
}

/** Advances count positive, payments negative; t and f measured from the first advance. */
export function appendixJSchedule(
	advances: DatedAmount[],
	payments: DatedAmount[]
): AppendixJSchedule {
	const advanceDates = advances.map((a) => parseDate(a.date));
	const paymentDates = payments.map((p) => parseDate(p.date));
	const unit = unitPeriodOf(advanceDates, paymentDates);
	const perYear = unitPeriodsPerYear(unit);
	const start = advanceDates[0];
	const terms: ScheduleTerm[] = [];
	const parsed = new Map<string, Dec>();
	const add = (dates: CalendarDate[], list: DatedAmount[], sign: 1 | -1) => {
		const scheduled = scheduledDay(dates);
		dates.forEach((date, k) => {
			const count = countUnitPeriods(start, date, unit, scheduled);
			const key = `${sign}${list[k].amount}`;
			let amount = parsed.get(key);
			if (!amount) {
				amount = sign === 1 ? new Dec(list[k].amount) : new Dec(list[k].amount).neg();
				parsed.set(key, amount);
			}
			terms.push({
				ticks: count.t,
				amount,
				fraction: { numerator: count.numerator, denominator: count.denominator }
			});
		});
	};
	add(advanceDates, advances, 1);
	add(paymentDates, payments, -1);
	return { schedule: buildSchedule(terms, 1, perYear.toNumber()), unit, perYear };
}
