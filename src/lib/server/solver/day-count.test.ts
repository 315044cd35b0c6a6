import { describe, expect, it } from 'vitest';
import {
	actActTicks,
	dayNumber,
	daysInMonth,
	fromDayNumber,
	parseDate,
	wholeMonthsBack
} from './day-count';

const d = parseDate;

describe('calendar arithmetic', () => {
	it('numbers days like the platform calendar', () => {
		for (const text of ['1900-03-01', '1970-01-01', '2000-02-29', '2024-12-31', '2200-01-01']) {
			const [y, m, day] = text.split('-').map(Number);
			expect(dayNumber(d(text))).toBe(Date.UTC(y, m - 1, day) / 86_400_000);
			expect(fromDayNumber(dayNumber(d(text)))).toEqual(d(text));
		}
		expect(daysInMonth(2024, 2)).toBe(29);
		expect(daysInMonth(1900, 2)).toBe(28);
	});

	it('counts whole months back from the later date, keeping the day of month', () => {
		// 10 Feb → 1 Apr: back one month to 1 Mar, then 19 days from 10 Feb (1978 is not leap).
		expect(wholeMonthsBack(d('1978-02-10'), d('1978-04-01'), 1)).toMatchObject({
			months: 1,
			remainderDays: 19
		});
		// A 31st-of-month series: 31 Jan → 30 Apr is 3 months when the scheduled day is 31.
		expect(wholeMonthsBack(d('2024-01-31'), d('2024-04-30'), 31)).toMatchObject({
			months: 3,
			remainderDays: 0
		});
		// The 30th falls on the end of February.
		expect(wholeMonthsBack(d('2023-01-30'), d('2023-02-28'), 30)).toMatchObject({
			months: 1,
			remainderDays: 0
		});
	});

	it('splits act/act spans at 1 January', () => {
		// 1994-01-01 → 1995-07-01: 546 days in ordinary years (366 ticks a day).
		expect(actActTicks(d('1994-01-01'), d('1995-07-01'))).toBe(546 * 366);
		// 2023-12-31 → 2024-01-02: one day in 2023 (366 ticks) and one in leap 2024 (365 ticks).
		expect(actActTicks(d('2023-12-31'), d('2024-01-02'))).toBe(366 + 365);
		// A whole leap year is exactly one year.
		expect(actActTicks(d('2024-01-01'), d('2025-01-01'))).toBe(365 * 366);
	});
});
