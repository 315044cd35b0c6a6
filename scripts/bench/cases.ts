import Decimal from 'decimal.js';
import { addDays, isoDate, seededRandom } from './timing';

/** (a) An invented 30-year loan: 360 monthly payments, long (odd) first period, final payment differs. */
export function oddFirstPeriodLoan() {
	const payments = Array.from({ length: 360 }, (_, k) => ({
		date: isoDate(2025, 3 + k, 1),
		amount: k === 359 ? '1604.27' : '1610.46'
	}));
	return {
		kind: 'apr-us' as const,
		advances: [{ date: '2025-01-17', amount: '252000.00' }],
		payments
	};
}

/** (b) 10,000 invented dated flows over 10 years: an outlay, then mixed receipts and costs. */
export function tenThousandDatedFlows() {
	const random = seededRandom(20_250_101);
	const start = '2015-01-01';
	const flows = [{ date: start, amount: '-5000000.00' }];
	const offsets = Array.from({ length: 9_999 }, () => 1 + Math.floor(random() * 3_652)).sort(
		(a, b) => a - b
	);
	for (const offset of offsets) {
		const amount = (random() * 2_000 - 300).toFixed(2);
		flows.push({ date: addDays(start, offset), amount });
	}
	return { kind: 'dated-irr' as const, flows };
}

const D = Decimal.clone({ precision: 60 });

export type Expected =
	{ kind: 'roots'; rates: string[] } | { kind: 'none' } | { kind: 'touching'; rate: string };

export interface HardCase {
	name: string;
	flows?: string[];
	dated?: { date: string; amount: string }[];
	expected: Expected;
	truth: string;
}

const repeat = (value: string, count: number) => Array.from({ length: count }, () => value);

/** (c) Cases with known answers (by construction or closed form). */
export function hardCases(): HardCase[] {
	return [
		{
			name: 'two roots: pump project',
			flows: ['-1600', '10000', '-10000'],
			expected: { kind: 'roots', rates: ['0.25', '4'] },
			truth: 'Lorie and Savage (1955): 25% and 400%'
		},
		{
			name: 'no root: 1000, -3000, 2500',
			flows: ['1000', '-3000', '2500'],
			expected: { kind: 'none' },
			truth: 'Brealey and Myers: no IRR (discriminant < 0)'
		},
		{
			name: 'three roots 5%, 20%, 50%',
			flows: ['-1', '3.75', '-4.635', '1.89'],
			expected: { kind: 'roots', rates: ['0.05', '0.2', '0.5'] },
			truth: 'built as -(1-1.05v)(1-1.2v)(1-1.5v)'
		},
		{
			name: 'two roots 2 points apart',
			flows: ['-1000', '2220', '-1232'],
			expected: { kind: 'roots', rates: ['0.1', '0.12'] },
			truth: 'built as -(1-1.1v)(1-1.12v)·1000'
		},
		{
			name: 'near -100%',
			flows: ['-1000', '0.001'],
			expected: { kind: 'roots', rates: ['-0.999999'] },
			truth: '1 + r = 0.001/1000'
		},
		{
			name: 'above 1000% per period',
			flows: ['-1', '5000'],
			expected: { kind: 'roots', rates: ['4999'] },
			truth: '1 + r = 5000'
		},
		{
			name: '1,200 periods (bond at par)',
			flows: ['-100', ...repeat('0.5', 1_199), '100.5'],
			expected: { kind: 'roots', rates: ['0.005'] },
			truth: 'coupon 0.5 on par 100: yield 0.5% exactly'
		},
		{
			name: '599 zero flows between',
			flows: ['-1000', ...repeat('0', 599), '2000'],
			expected: { kind: 'roots', rates: [new D(2).pow(new D(1).div(600)).minus(1).toString()] },
			truth: '2^(1/600) - 1'
		},
		{
			name: 'all one sign',
			flows: ['100', '200', '300'],
			expected: { kind: 'none' },
			truth: 'NPV > 0 at every rate'
		},
		{
			name: 'touching (double) root at 0%',
			flows: ['-1', '2', '-1'],
			expected: { kind: 'touching', rate: '0' },
			truth: 'NPV = -(1 - v)^2 touches zero at r = 0'
		},
		{
			name: 'dated, two roots 10% and 30%',
			dated: [
				{ date: '2021-01-01', amount: '-1000' },
				{ date: '2022-01-01', amount: '2400' },
				{ date: '2023-01-01', amount: '-1430' }
			],
			expected: { kind: 'roots', rates: ['0.1', '0.3'] },
			truth: 'act/365, whole years: -(1-1.1v)(1-1.3v)·1000'
		},
		{
			name: 'dated, no root',
			dated: [
				{ date: '2021-01-01', amount: '1000' },
				{ date: '2022-01-01', amount: '-3000' },
				{ date: '2023-01-01', amount: '2500' }
			],
			expected: { kind: 'none' },
			truth: 'same polynomial as the undated no-root case'
		}
	];
}
