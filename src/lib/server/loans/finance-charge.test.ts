import { describe, expect, it } from 'vitest';
import { financeChargeTolerance } from './finance-charge';

describe('finance charge tolerance, 12 CFR 1026.18(d)', () => {
	it('(d)(2)(i): amount financed $1,000 or less — $5 either way, inclusive', () => {
		expect(financeChargeTolerance('209.96', '214.96', '1000.00', false).accurate).toBe(true);
		expect(financeChargeTolerance('209.96', '204.96', '1000.00', false).accurate).toBe(true);
		expect(financeChargeTolerance('209.96', '214.97', '1000.00', false).accurate).toBe(false);
		expect(financeChargeTolerance('209.96', '204.95', '1000.00', false).accurate).toBe(false);
	});

	it('(d)(2)(ii): amount financed over $1,000 — $10 either way', () => {
		expect(financeChargeTolerance('500.00', '510.00', '1000.01', false).accurate).toBe(true);
		expect(financeChargeTolerance('500.00', '510.01', '1000.01', false).accurate).toBe(false);
		expect(financeChargeTolerance('500.00', '489.99', '25000.00', false)).toMatchObject({
			accurate: false,
			difference: '-10.01'
		});
	});

	it('(d)(1): secured by real property — understated by no more than $100, any overstatement', () => {
		expect(financeChargeTolerance('50000.00', '49900.00', '200000.00', true).accurate).toBe(true);
		expect(financeChargeTolerance('50000.00', '49899.99', '200000.00', true).accurate).toBe(false);
		expect(financeChargeTolerance('50000.00', '52000.00', '200000.00', true)).toMatchObject({
			accurate: true,
			accepted: { low: '49900.00', high: null }
		});
	});
});
