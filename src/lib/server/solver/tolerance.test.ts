import { describe, expect, it } from 'vitest';
import { solve } from './solve';
import { regularity, toleranceCheck } from './tolerance';

const monthly = (count: number, amount: (k: number) => string, day = 1) =>
	Array.from({ length: count }, (_, k) => ({
		date: new Date(Date.UTC(2024, 1 + k, day)).toISOString().slice(0, 10),
		amount: amount(k)
	}));

describe('12 CFR 1026.22 tolerances', () => {
	it('Supplement I comment 22(a)(2)-1: an exact APR of 10 1/8% makes 10% to 10 1/4% accurate', () => {
		// A one-year single payment: 1,000 → 1,101.25 has an APR of exactly 10.125%.
		const result = solve({
			kind: 'apr-us',
			advances: [{ date: '2024-01-15', amount: '1000' }],
			payments: [{ date: '2025-01-15', amount: '1101.25' }]
		});
		expect(result.regularity?.classification).toBe('regular');
		expect(toleranceCheck(result, '0.1').accurate).toBe(true);
		expect(toleranceCheck(result, '0.1025').accurate).toBe(true);
		expect(toleranceCheck(result, '0.10125').accurate).toBe(true);
		expect(toleranceCheck(result, '0.0999').accurate).toBe(false);
		expect(toleranceCheck(result, '0.1026').accurate).toBe(false);
		const check = toleranceCheck(result, '0.1');
		expect(Number(check.accepted?.low)).toBeCloseTo(0.1, 11);
		expect(Number(check.accepted?.high)).toBeCloseTo(0.1025, 11);
	});

	it('1026.22(a)(3): irregular transactions get 1/4 of a percentage point', () => {
		const loan = {
			advances: [
				{ date: '2024-01-01', amount: '500' },
				{ date: '2024-01-15', amount: '500' }
			],
			payments: monthly(12, () => '90')
		};
		const result = solve({ kind: 'apr-us', ...loan });
		expect(result.regularity).toMatchObject({ classification: 'irregular', tolerance: '0.0025' });
		const apr = Number(result.rate);
		expect(toleranceCheck(result, (apr + 0.0024).toFixed(6)).accurate).toBe(true);
		expect(toleranceCheck(result, (apr + 0.0026).toFixed(6)).accurate).toBe(false);
	});

	it('an odd first period and odd first or final payments stay regular', () => {
		const payments = monthly(24, (k) => (k === 0 ? '260.11' : k === 23 ? '198.40' : '230.00'));
		expect(
			regularity({ advances: [{ date: '2024-01-10', amount: '5000' }], payments })
		).toMatchObject({
			classification: 'regular',
			tolerance: '0.00125'
		});
		const uneven = monthly(24, (k) => (k === 5 ? '500.00' : '230.00'));
		expect(
			regularity({ advances: [{ date: '2024-01-10', amount: '5000' }], payments: uneven }).reasons
		).toEqual(['irregular payment amounts (other than the first or final payment)']);
		const skipped = monthly(24, () => '230.00').filter((_, k) => k !== 7);
		expect(
			regularity({ advances: [{ date: '2024-01-10', amount: '5000' }], payments: skipped }).reasons
		).toEqual(['irregular payment periods (after the first period)']);
	});

	it('checks only solved apr-us results', () => {
		const irr = solve({ kind: 'irr', flows: ['-100', '110'] });
		expect(toleranceCheck(irr, '0.1').accurate).toBe(false);
	});
});
