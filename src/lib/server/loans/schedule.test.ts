import Decimal from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { parsePastedRows, type LoanTerms } from '../../schemas/loan';
import { dueDates } from './dates';
import { groupPayments, scheduleFromRows, scheduleFromTerms } from './schedule';

const terms = (over: Partial<LoanTerms> = {}): LoanTerms => ({
	reference: 'T-1',
	borrowerName: 'Test',
	regime: 'us-apr',
	securedByRealProperty: false,
	amountOfCredit: '1000.00',
	noteRate: '12',
	numberOfPayments: 12,
	frequency: 'monthly',
	advanceDate: '2026-01-01',
	firstPaymentDate: '2026-02-01',
	balloon: '',
	rounding: 'nearest',
	feeName: [],
	feeAmount: [],
	feeKind: [],
	...over
});

describe('due dates', () => {
	it('keep the day of month and clamp at month end', () => {
		expect(dueDates('2026-01-31', 4, 'monthly')).toEqual([
			'2026-01-31',
			'2026-02-28',
			'2026-03-31',
			'2026-04-30'
		]);
	});
	it('alternate semimonthly between the day and 15 days later', () => {
		expect(dueDates('2026-01-15', 4, 'semimonthly')).toEqual([
			'2026-01-15',
			'2026-01-30',
			'2026-02-15',
			'2026-02-28'
		]);
		expect(dueDates('2026-01-20', 3, 'semimonthly')).toEqual([
			'2026-01-20',
			'2026-02-05',
			'2026-02-20'
		]);
	});
	it('step weeks and quarters', () => {
		expect(dueDates('2026-12-28', 2, 'biweekly')).toEqual(['2026-12-28', '2027-01-11']);
		expect(dueDates('2026-11-30', 2, 'quarterly')).toEqual(['2026-11-30', '2027-02-28']);
	});
});

describe('schedule from terms', () => {
	it('level payment of the annuity formula, last payment absorbing the rounding (common practice)', () => {
		// 1,000 at 12%/12 over 12 months: payment = 1000 · 0.01 / (1 − 1.01^−12) = 88.8487887… → 88.85.
		const f = scheduleFromTerms(terms());
		expect(f.levelPayment).toBe('88.85');
		expect(f.payments.slice(0, 11).every((p) => p.amount === '88.85')).toBe(true);
		expect(f.payments.at(-1)!.balance).toBe('0.00');
		const exact = new Decimal(1000)
			.times(0.01)
			.div(new Decimal(1).minus(new Decimal(1.01).pow(-12)));
		expect(exact.toFixed(7)).toBe('88.8487887');
		expect(new Decimal(f.payments.at(-1)!.amount).minus(88.85).abs().lte(0.05)).toBe(true);
	});

	it('a zero note rate splits the credit evenly', () => {
		const f = scheduleFromTerms(
			terms({ noteRate: '0', amountOfCredit: '1000', numberOfPayments: 3 })
		);
		expect(f.payments.map((p) => p.amount)).toEqual(['333.33', '333.33', '333.34']);
		expect(f.financeCharge).toBe('0.00');
	});

	it('follows 12 CFR 1026.18(b): amount financed = note − prepaid finance charges, however paid', () => {
		const f = scheduleFromTerms(
			terms({
				feeName: ['Origination', 'Processing', 'Title', 'Recording'],
				feeAmount: ['50.00', '20.00', '30.00', '5.00'],
				feeKind: ['finance-charge-financed', 'finance-charge-cash', 'other-financed', 'other-cash']
			})
		);
		expect(f.noteAmount).toBe('1080.00'); // 1000 + 50 + 30 financed
		expect(f.prepaidFinanceCharge).toBe('70.00');
		expect(f.amountFinanced).toBe('1010.00');
		expect(
			new Decimal(f.financeCharge).eq(new Decimal(f.totalOfPayments).minus(f.amountFinanced))
		).toBe(true);
	});

	it('makes the balloon the final payment and counts the odd first period in days', () => {
		const f = scheduleFromTerms(
			terms({
				balloon: '400',
				numberOfPayments: 12,
				advanceDate: '2026-01-01',
				firstPaymentDate: '2026-02-20'
			})
		);
		expect(f.oddDays).toBe(19);
		expect(new Decimal(f.payments.at(-1)!.amount).minus(400).abs().lte(1)).toBe(true);
		expect(f.payments.at(-1)!.balance).toBe('0.00');
	});

	it('groups payments the way disclosures show them', () => {
		const f = scheduleFromTerms(terms());
		expect(groupPayments(f.payments).map((g) => [g.count, g.amount])).toEqual([
			[11, '88.85'],
			[1, f.payments.at(-1)!.amount]
		]);
	});
});

describe('schedule entry', () => {
	it('reads pasted rows: tabs, an optional header, the first row as the advance', () => {
		const parsed = parsePastedRows('date\tamount\n2026-01-10\t1,000.00\n2026-02-10\t$33.61\n');
		expect(parsed).toEqual({
			rows: [
				{ kind: 'advance', date: '2026-01-10', amount: '1000.00' },
				{ kind: 'payment', date: '2026-02-10', amount: '33.61' }
			]
		});
	});
	it('names the line of a bad row', () => {
		expect(parsePastedRows('2026-01-10\t1000\n2026-13-10\t5')).toEqual({
			line: 2,
			message: 'Line 2: "2026-13-10" is not a date written 2026-03-15.'
		});
		expect(parsePastedRows('2026-01-10\tabc')).toMatchObject({ line: 1 });
	});
	it('totals several advances as the amount financed', () => {
		const f = scheduleFromRows([
			{ kind: 'advance', date: '2026-01-01', amount: '500' },
			{ kind: 'advance', date: '2026-02-01', amount: '500' },
			{ kind: 'payment', date: '2026-03-01', amount: '1050' }
		]);
		expect(f.amountFinanced).toBe('1000.00');
		expect(f.financeCharge).toBe('50.00');
	});
});
