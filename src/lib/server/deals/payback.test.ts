import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { Dec } from '../solver/decimal';
import { datedNpv, npv } from '../solver/npv';
import {
	datedDiscountedPayback,
	datedSimplePayback,
	discountedPayback,
	simplePayback,
	type DatedAmount,
	type DatedPaybackResult,
	type PaybackResult
} from './payback';

function reached(result: PaybackResult) {
	if (!result.reached) throw new Error(`not reached: ${result.message}`);
	return result;
}

function reachedDated(result: DatedPaybackResult) {
	if (!result.reached) throw new Error(`not reached: ${result.message}`);
	return result;
}

const near = (value: string, target: Dec, tolerance = '1e-30') =>
	new Dec(value).minus(target).abs().lte(tolerance);

describe('periodic payback', () => {
	it('matches a textbook-style example derived by hand', () => {
		// Outlay 2500, then 1100, 1210, 1331. Running total: −2500, −1400, −190, +1141, so payback
		// falls in period 3, 190/1331 of the way through: 2 + 190/1331 periods.
		const flows = ['-2500', '1100', '1210', '1331'];
		const simple = reached(simplePayback(flows));
		expect(simple.period).toBe('2.142749812171299774605559729526671675432');
		expect(near(new Dec(simple.period).minus(2).times(1331).toString(), new Dec(190))).toBe(true);
		expect(simple).toMatchObject({
			crossingIndex: 3,
			staysRecovered: true,
			finalCumulative: '1141'
		});
		// At 10% per period each inflow is worth exactly 1000 today: −2500, −1500, −500, +500,
		// so discounted payback is 2 + 500/1000 = 2.5 periods.
		expect(discountedPayback(flows, '0.1')).toEqual({
			reached: true,
			period: '2.5',
			crossingIndex: 3,
			staysRecovered: true,
			finalCumulative: '500'
		});
	});

	it('gives a whole period when the running total reaches exactly zero', () => {
		expect(reached(simplePayback(['-1000', '400', '600', '100']))).toMatchObject({
			period: '2',
			crossingIndex: 2
		});
	});

	it('says when payback is never reached, and why', () => {
		expect(simplePayback(['-1000', '300', '300', '300'])).toEqual({
			reached: false,
			reason: 'not-recovered',
			message: 'The cumulative cash flow is still negative (-100) after the last flow.',
			finalCumulative: '-100'
		});
		// Simple payback is reached (1 + 500/600), but discounted at 10% the inflows fall short.
		expect(reached(simplePayback(['-1000', '500', '600'])).period).toBe(
			'1.833333333333333333333333333333333333333'
		);
		const discounted = discountedPayback(['-1000', '500', '600'], '0.1');
		expect(discounted).toMatchObject({ reached: false, reason: 'not-recovered' });
		expect(simplePayback(['0', '100'])).toMatchObject({ reached: false, reason: 'no-outlay' });
		expect(simplePayback([])).toMatchObject({ reached: false, reason: 'no-flows' });
	});

	it('common practice: the first crossing counts, even if the total dips below zero later', () => {
		// −1000, −400, +200, −300, +100: first crossing in period 2, 400/600 of the way through.
		const result = reached(simplePayback(['-1000', '600', '600', '-500', '400']));
		expect(result.period).toBe('1.666666666666666666666666666666666666667');
		expect(result).toMatchObject({
			crossingIndex: 2,
			staysRecovered: false,
			finalCumulative: '100'
		});
	});

	it('refuses a rate of −100% or below', () => {
		expect(() => discountedPayback(['-1', '2'], '-1')).toThrow(RangeError);
	});

	it('agrees with a direct decimal computation of the discounted running totals', () => {
		// The running total through period j is the NPV of flows 0..j, computed here by the
		// solver's own decimal NPV, a separate code path from the payback module.
		fc.assert(
			fc.property(
				fc.array(fc.integer({ min: -5000, max: 5000 }), { minLength: 1, maxLength: 10 }),
				fc.integer({ min: 0, max: 40 }),
				(amounts, percent) => {
					const flows = amounts.map(String);
					const rate = String(percent / 100);
					const result = discountedPayback(flows, rate);
					const total = (j: number) =>
						j < 0 ? new Dec(0) : new Dec(npv(flows.slice(0, j + 1), rate));
					const crossesAt = (j: number) => total(j - 1).lt(0) && total(j).gte(0);
					if (!result.reached) {
						expect(flows.every((_, j) => !crossesAt(j))).toBe(true);
						return;
					}
					const k = result.crossingIndex;
					expect(crossesAt(k)).toBe(true);
					expect(flows.slice(0, k).every((_, j) => !crossesAt(j))).toBe(true);
					const fraction = total(k - 1)
						.neg()
						.div(total(k).minus(total(k - 1)));
					expect(near(result.period, fraction.plus(k - 1), '1e-25')).toBe(true);
					if (percent === 0) expect(simplePayback(flows)).toEqual(result);
				}
			),
			{ numRuns: 200 }
		);
	});
});

describe('dated payback (act/365 from the first date)', () => {
	it('matches a dated example derived by hand', () => {
		// −1000 on 2025-01-01, +600 a year later, +600 two years later: running total −1000, −400,
		// +200, so payback lies 400/600 of the way through the second year: 1 + 2/3 years, on day
		// 365 + 243⅓ → the first whole day after it is day 609, 2026-09-02.
		const flows: DatedAmount[] = [
			{ date: '2025-01-01', amount: '-1000' },
			{ date: '2026-01-01', amount: '600' },
			{ date: '2027-01-01', amount: '600' }
		];
		const simple = reachedDated(datedSimplePayback(flows));
		expect(near(simple.years, new Dec(5).div(3))).toBe(true);
		expect(simple).toMatchObject({ date: '2026-09-02', crossingIndex: 2, staysRecovered: true });
		// At 20% a year both inflows are worth 500 and 416.67 today: never recovered.
		expect(datedDiscountedPayback(flows, '0.2')).toMatchObject({
			reached: false,
			reason: 'not-recovered'
		});
	});

	it('discounts by whole and fractional years (worked by hand)', () => {
		// At 20%: 1200 after one year and 1440 after two are each worth exactly 1000 today, so the
		// total runs −1500, −500, +500: payback 1.5 years, day 547.5, first whole day 548.
		const flows: DatedAmount[] = [
			{ date: '2025-01-01', amount: '-1500' },
			{ date: '2026-01-01', amount: '1200' },
			{ date: '2027-01-01', amount: '1440' }
		];
		expect(datedDiscountedPayback(flows, '0.2')).toEqual({
			reached: true,
			years: '1.5',
			date: '2026-07-03',
			crossingIndex: 2,
			staysRecovered: true,
			finalCumulative: '500'
		});
	});

	it('refuses dates out of order or not written YYYY-MM-DD', () => {
		const late = { date: '2026-01-01', amount: '-10' };
		expect(() => datedSimplePayback([late, { date: '2025-12-31', amount: '20' }])).toThrow(
			'comes before flow 0'
		);
		expect(() => datedSimplePayback([{ date: '2026-02-30', amount: '1' }])).toThrow(RangeError);
		expect(() => datedDiscountedPayback([late], '-1.5')).toThrow(RangeError);
	});

	it('agrees with a direct decimal computation of the discounted running totals', () => {
		const start = Date.UTC(2025, 0, 1);
		fc.assert(
			fc.property(
				fc.array(
					fc.record({
						gap: fc.integer({ min: 0, max: 400 }),
						amount: fc.integer({ min: -5000, max: 5000 })
					}),
					{ minLength: 1, maxLength: 8 }
				),
				fc.integer({ min: 0, max: 40 }),
				(steps, percent) => {
					let day = 0;
					const days: number[] = [];
					const flows: DatedAmount[] = steps.map((step, i) => {
						day += i === 0 ? 0 : step.gap;
						days.push(day);
						const date = new Date(start + day * 86_400_000).toISOString().slice(0, 10);
						return { date, amount: String(step.amount) };
					});
					const rate = String(percent / 100);
					const result = datedDiscountedPayback(flows, rate);
					const total = (j: number) =>
						j < 0 ? new Dec(0) : new Dec(datedNpv(flows.slice(0, j + 1), rate));
					const crossesAt = (j: number) => total(j - 1).lt(0) && total(j).gte(0);
					if (!result.reached) {
						expect(flows.every((_, j) => !crossesAt(j))).toBe(true);
						return;
					}
					const k = result.crossingIndex;
					expect(crossesAt(k)).toBe(true);
					expect(flows.slice(0, k).every((_, j) => !crossesAt(j))).toBe(true);
					const fraction = total(k - 1)
						.neg()
						.div(total(k).minus(total(k - 1)));
					const elapsed = fraction.times(days[k] - days[k - 1]).plus(days[k - 1]);
					expect(near(result.years, elapsed.div(365), '1e-25')).toBe(true);
					// Away from whole days, where rounding in the last digit could move the ceiling.
					if (elapsed.minus(elapsed.round()).abs().gt('1e-20')) {
						const expectedDay = new Date(start + elapsed.ceil().toNumber() * 86_400_000);
						expect(result.date).toBe(expectedDay.toISOString().slice(0, 10));
					}
				}
			),
			{ numRuns: 200 }
		);
	});
});
