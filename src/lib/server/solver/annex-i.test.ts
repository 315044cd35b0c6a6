import { describe, expect, it } from 'vitest';
import { countPeriods } from './annex-i';
import { parseDate } from './day-count';
import { solve } from './solve';

const aprc = (
	drawdown: string,
	repayments: { date: string; amount: string }[],
	timeBasis: 'days' | 'periods' = 'days'
) =>
	solve({
		kind: 'aprc-eu',
		drawdowns: [{ date: '1994-01-01', amount: drawdown }],
		repayments,
		timeBasis
	});

describe('EU APRC, Directive 98/7/EC Annex III worked examples', () => {
	// Calendar basis (365 days, 366 in leap years). Values from the Annex text.
	it('first example: 1,000 on 1 Jan 1994, 1,200 on 1 Jul 1995 (546 days) → 12.96% (13%)', () => {
		const result = aprc('1000', [{ date: '1995-07-01', amount: '1200' }]);
		expect(Number(result.rate)).toBeCloseTo(0.1296, 4);
		expect(result.disclosed).toBe('13.0');
	});

	it('second example: 950 net of 50 charges, same repayment → 16.9%', () => {
		expect(aprc('950', [{ date: '1995-07-01', amount: '1200' }]).disclosed).toBe('16.9');
	});

	it('third example: 600 after one and after two years → i = 0.1306623..., 13.07%', () => {
		const result = aprc('1000', [
			{ date: '1995-01-01', amount: '600' },
			{ date: '1996-01-01', amount: '600' }
		]);
		expect(Number(result.rate)).toBeCloseTo(0.1306623, 6);
		expect(result.disclosed).toBe('13.1');
	});

	// Standard-year basis (whole years, months, weeks). From memory.
	it('first example on the standard year: 1.5 years → 12.92% (from memory)', () => {
		const result = aprc('1000', [{ date: '1995-07-01', amount: '1200' }], 'periods');
		expect(Number(result.rate)).toBeCloseTo(0.1292, 4);
	});

	it('fourth example on the standard year: 272, 272, 544 after 3, 6, 12 months → 13.19% (from memory)', () => {
		const result = aprc(
			'1000',
			[
				{ date: '1994-04-01', amount: '272' },
				{ date: '1994-07-01', amount: '272' },
				{ date: '1995-01-01', amount: '544' }
			],
			'periods'
		);
		expect(Number(result.rate)).toBeCloseTo(0.1319, 4);
	});
});

describe('Annex I time counting', () => {
	it('counts whole years, months, weeks and days back from each date', () => {
		expect(countPeriods(parseDate('2024-01-15'), parseDate('2025-03-31'))).toEqual({
			years: 1,
			months: 2,
			weeks: 2,
			days: 2
		});
		// Month end to month end counts whole months.
		expect(countPeriods(parseDate('2024-01-31'), parseDate('2024-02-29'))).toEqual({
			years: 0,
			months: 1,
			weeks: 0,
			days: 0
		});
	});

	it('splits a span crossing into a leap year at 1 January (days basis)', () => {
		// 2023-07-01 → 2024-07-01: 184 days of 2023 (/365) and 182 of 2024 (/366).
		const t = 184 / 365 + 182 / 366;
		const shifted = solve({
			kind: 'aprc-eu',
			drawdowns: [{ date: '2023-07-01', amount: '1000' }],
			repayments: [{ date: '2024-07-01', amount: '1100' }]
		});
		expect(Number(shifted.rate)).toBeCloseTo(1.1 ** (1 / t) - 1, 12);
	});
});
