import { describe, expect, it } from 'vitest';
import { fromDayNumber, dayNumber, monthsBack, wholeMonthsBack } from './day-count';
import { classifyInterval, countingDay } from './unit-period';

describe('classifyInterval', () => {
	it('agrees with counting whole months back for every same-day pair over three years', () => {
		let checked = 0;
		for (
			let n = dayNumber({ year: 2023, month: 1, day: 1 });
			n < dayNumber({ year: 2026, month: 1, day: 1 });
			n += 1
		) {
			const from = fromDayNumber(n);
			for (let months = 1; months <= 14; months += 1) {
				const to = monthsBack(from, -months, from.day);
				if (to.day !== from.day) continue; // clamped at a month end: not a same-day pair
				const back = wholeMonthsBack(from, to, countingDay(to, from.day));
				expect(back).toMatchObject({ months, remainderDays: 0 });
				expect(classifyInterval(from, to, from.day)).toEqual({ kind: 'month', months });
				checked += 1;
			}
		}
		expect(checked).toBeGreaterThan(14_000);
	});

	it('applies the month-end rule: 31 January to 28 February is a month for a series on the 31st', () => {
		// 12 CFR 1026 Appendix J (b)(3)(iv) month-end rule (reading from memory).
		const jan31 = { year: 2025, month: 1, day: 31 };
		const feb28 = { year: 2025, month: 2, day: 28 };
		expect(classifyInterval(jan31, feb28, 31)).toEqual({ kind: 'month', months: 1 });
		expect(classifyInterval(feb28, { year: 2025, month: 3, day: 28 }, 28)).toEqual({
			kind: 'month',
			months: 1
		});
		expect(classifyInterval(jan31, { year: 2025, month: 2, day: 14 }, 31)).toEqual({
			kind: 'week',
			weeks: 2
		});
	});
});
