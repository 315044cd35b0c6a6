import * as financial from 'financial';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { mirr } from './mirr';

describe('MIRR', () => {
	it('matches a hand computation', () => {
		// Outflow 1000 at period 0; inflows 300, 400, 500 compounded at 12% to period 3:
		// 300·1.12² + 400·1.12 + 500 = 1324.32, so MIRR = (1324.32 / 1000)^(1/3) − 1.
		expect(Number(mirr(['-1000', '300', '400', '500'], '0.1', '0.12'))).toBeCloseTo(
			1.32432 ** (1 / 3) - 1,
			14
		);
	});

	// @formulajs/formulajs is not used here: its MIRR drops the flows' positions when it splits
	// them into inflows and outflows, so it is wrong whenever the signs interleave.
	it('agrees with the independent float64 implementation in `financial` (property)', () => {
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: -5000, max: 5000 }), { minLength: 2, maxLength: 12 }),
				fc.integer({ min: 0, max: 30 }),
				fc.integer({ min: 0, max: 30 }),
				(flows, finance, reinvest) => {
					if (!flows.some((f) => f < 0) || !flows.some((f) => f > 0)) {
						return mirr(flows.map(String), '0.1', '0.1') === null;
					}
					const ours = Number(
						mirr(flows.map(String), String(finance / 100), String(reinvest / 100))
					);
					const reference = financial.mirr(flows, finance / 100, reinvest / 100);
					return Math.abs(ours - reference) < 1e-9;
				}
			),
			{ numRuns: 60 }
		);
	});

	it('has no value without flows of both signs', () => {
		expect(mirr(['100', '200'], '0.1', '0.1')).toBeNull();
		expect(mirr(['-100'], '0.1', '0.1')).toBeNull();
	});
});
