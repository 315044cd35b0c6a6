import { describe, expect, it } from 'vitest';
import { countUnitPeriods } from './appendix-j';
import { scheduledDay, unitPeriodOf } from './unit-period';
import { parseDate } from './day-count';
import { solve } from './solve';

const iso = (y: number, m: number, d: number) =>
	new Date(Date.UTC(y, m - 1, d)).toISOString().slice(0, 10);
const series = (count: number, date: (k: number) => string, amount: string) =>
	Array.from({ length: count }, (_, k) => ({ date: date(k), amount }));
const apr = (advance: [string, string], payments: { date: string; amount: string }[]) =>
	solve({ kind: 'apr-us', advances: [{ date: advance[0], amount: advance[1] }], payments });

describe('12 CFR 1026 Appendix J, published examples', () => {
	it('(b)(9): $1,000 repaid by 36 monthly payments of $33.61 → 12.83%', () => {
		const result = apr(
			['1978-01-10', '1000'],
			series(36, (k) => iso(1978, 2 + k, 10), '33.61')
		);
		expect(result.status).toBe('solved');
		expect(result.disclosed).toBe('12.83');
		expect(result.unitPeriod?.kind).toBe('month');
		expect(result.unitPeriodsPerYear).toBe('12');
	});

	// Appendix J (c)(1), single advance, otherwise regular. Inputs from memory; each case also
	// checks the t and f the appendix states for the first payment where recalled.
	it('(c)(1)(i) monthly, regular first period: $5,000, 24 × $230 → 9.69% (from memory)', () => {
		const result = apr(
			['1978-01-10', '5000'],
			series(24, (k) => iso(1978, 2 + k, 10), '230')
		);
		expect(result.disclosed).toBe('9.69');
	});

	it('(c)(1)(ii) monthly, long first period: $6,000, 36 × $200, 2-10-78 → 4-1-78 → 11.82% (from memory)', () => {
		const result = apr(
			['1978-02-10', '6000'],
			series(36, (k) => iso(1978, 4 + k, 1), '200')
		);
		expect(result.disclosed).toBe('11.82');
		// t = 1 whole month back from 4-1 to 3-1, then 19 days (3-1 back to 2-10) over 30.
		const count = countUnitPeriods(
			parseDate('1978-02-10'),
			parseDate('1978-04-01'),
			{ kind: 'month', months: 1 },
			1
		);
		expect(count).toEqual({ t: 1, numerator: 19, denominator: 30 });
	});

	it('(c)(1)(iii) semimonthly, short first period: $5,000, 24 × $219.17 → 10.34% (from memory)', () => {
		const payments = series(
			24,
			(k) => iso(1978, 3 + Math.floor(k / 2), k % 2 === 0 ? 1 : 16),
			'219.17'
		);
		const result = apr(['1978-02-23', '5000'], payments);
		expect(result.unitPeriod?.kind).toBe('semimonth');
		expect(result.unitPeriodsPerYear).toBe('24');
		expect(result.disclosed).toBe('10.34');
		// f = 6/15 for the first payment (2-23 → 3-1 is 6 days).
		const count = countUnitPeriods(
			parseDate('1978-02-23'),
			parseDate('1978-03-01'),
			{ kind: 'semimonth' },
			1
		);
		expect(count).toEqual({ t: 0, numerator: 6, denominator: 15 });
	});

	it('(c)(1)(iv) quarterly, long first period: $10,000, 40 × $385 → 8.97% (from memory)', () => {
		const result = apr(
			['1978-05-23', '10000'],
			series(40, (k) => iso(1978, 10 + 3 * k, 1), '385')
		);
		expect(result.unitPeriod).toMatchObject({ kind: 'month', count: 3 });
		expect(result.disclosed).toBe('8.97');
		// 4 months and 9 days = 129 days on a 30-day month basis: t = 1, f = 39/90.
		const count = countUnitPeriods(
			parseDate('1978-05-23'),
			parseDate('1978-10-01'),
			{ kind: 'month', months: 3 },
			1
		);
		expect(count).toEqual({ t: 1, numerator: 39, denominator: 90 });
	});

	it('(c)(1)(v) weekly, long first period: $500, 30 × $17.60 → 14.96% (from memory)', () => {
		const result = apr(
			['1978-03-20', '500'],
			series(30, (k) => iso(1978, 4, 21 + 7 * k), '17.60')
		);
		expect(result.unitPeriod).toMatchObject({ kind: 'week', count: 1 });
		expect(result.disclosed).toBe('14.96');
		// 32 days: t = 4 weeks, f = 4/7.
		const count = countUnitPeriods(
			parseDate('1978-03-20'),
			parseDate('1978-04-21'),
			{ kind: 'week', weeks: 1 },
			21
		);
		expect(count).toEqual({ t: 4, numerator: 4, denominator: 7 });
	});
});

describe('Appendix J counting rules', () => {
	const dates = (...texts: string[]) => texts.map(parseDate);

	it('chooses the most frequent common period, the shorter on a tie ((b)(4)(i)(A))', () => {
		// An odd 17-day first period, three monthly and three two-week periods: the shorter wins.
		const payments = dates(
			'2024-02-01',
			'2024-03-01',
			'2024-04-01',
			'2024-05-01',
			'2024-05-15',
			'2024-05-29',
			'2024-06-12'
		);
		expect(unitPeriodOf(dates('2024-01-15'), payments)).toEqual({ kind: 'week', weeks: 2 });
		// From 1 January the first period is a month too: four months beat three two-week periods.
		expect(unitPeriodOf(dates('2024-01-01'), payments)).toEqual({ kind: 'month', months: 1 });
	});

	it('with no common period takes the average, rounded to a standard interval ((b)(4)(i)(B))', () => {
		// Periods of 31 and 59 days: average 45 days, nearest standard interval 6 weeks (42 days).
		expect(unitPeriodOf(dates('2024-01-01'), dates('2024-02-01', '2024-03-31'))).toEqual({
			kind: 'week',
			weeks: 6
		});
	});

	it('uses the term as unit period for a single advance and single payment ((b)(4)(ii), (b)(5)(vi)–(vii))', () => {
		// Six whole months: 2 unit periods a year; 1000 → 1050 is 5% per term, APR 10.00%.
		const sixMonths = apr(['2024-01-15', '1000'], [{ date: '2024-07-15', amount: '1050' }]);
		expect(sixMonths.unitPeriod).toMatchObject({ kind: 'term', count: 6 });
		expect(sixMonths.unitPeriodsPerYear).toBe('2');
		expect(sixMonths.disclosed).toBe('10.00');
		// 181 days: 365/181 unit periods a year; APR = 5% × 365/181 = 10.08%.
		const days = apr(['2024-01-15', '1000'], [{ date: '2024-07-14', amount: '1050' }]);
		expect(days.unitPeriod).toMatchObject({ kind: 'term', count: 181 });
		expect(days.disclosed).toBe('10.08');
		// Longer than a year: the year is the unit period, the rest counted in months/12.
		const long = apr(['2024-01-15', '1000'], [{ date: '2025-07-15', amount: '1150' }]);
		expect(long.unitPeriod).toMatchObject({ kind: 'year' });
		// (1 + 0.5 i)(1 + i) = 1.15 → i = 0.0957..., hand-solved quadratic.
		const i = (-1.5 + Math.sqrt(2.25 + 4 * 0.5 * 0.15)) / 1;
		expect(Number(long.rate)).toBeCloseTo(i, 12);
	});

	it('applies the month-end rule to a series on the last day of each month ((b)(3)(iv))', () => {
		const payments = dates('2024-01-31', '2024-02-29', '2024-03-31', '2024-04-30');
		expect(scheduledDay(payments)).toBe(31);
		const count = countUnitPeriods(
			parseDate('2023-12-31'),
			parseDate('2024-04-30'),
			{ kind: 'month', months: 1 },
			31
		);
		expect(count).toEqual({ t: 4, numerator: 0, denominator: 30 });
	});

	it('solves multiple advances with the general equation ((b)(8))', () => {
		// Two advances a month apart, repaid by 12 monthly payments; check the equation holds at the rate.
		const result = solve({
			kind: 'apr-us',
			advances: [
				{ date: '2024-01-01', amount: '500' },
				{ date: '2024-02-01', amount: '500' }
			],
			payments: series(12, (k) => iso(2024, 3 + k, 1), '90')
		});
		expect(result.status).toBe('solved');
		const i = Number(result.ratePerPeriod);
		let equation = 500 + 500 / (1 + i);
		for (let k = 2; k <= 13; k += 1) equation -= 90 / (1 + i) ** k;
		expect(Math.abs(equation)).toBeLessThan(1e-9);
		expect(result.regularity?.classification).toBe('irregular');
	});
});
