import Decimal from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { dealContentSchema, type DealContentInput } from '../../schemas/deal';
import { analyseDeal } from './analysis';

const periodic = (flows: string[], extra: Partial<DealContentInput> = {}) =>
	dealContentSchema.parse({
		mode: 'periodic',
		periodsPerYear: 1,
		flows: flows.map((amount, period) => ({ period, amount })),
		...extra
	});

describe('deal analysis', () => {
	it('reports both rates of the pump project: 25% and 400% (Lorie and Savage, 1955)', () => {
		const a = analyseDeal(periodic(['-1600', '10000', '-10000']));
		expect(a.result.status).toBe('multiple-roots');
		expect(a.rates.map((r) => new Decimal(r.perPeriod!).toDecimalPlaces(10).toString())).toEqual([
			'0.25',
			'4'
		]);
		expect(a.traces).toHaveLength(2);
		for (const runs of a.traces) expect(runs.map((r) => r.method)).toEqual(['bisection', 'itp']);
	});

	it('searches only the range asked for, and warns that other rates may lie outside it', () => {
		const a = analyseDeal(
			periodic(['-1600', '10000', '-10000'], { scanLow: '0', scanHigh: '100' })
		);
		expect(a.result.status).toBe('solved');
		expect(new Decimal(a.rates[0].perPeriod!).toDecimalPlaces(10).toString()).toBe('0.25');
		expect(a.result.warnings.map((w) => w.code)).toContain('more-roots-possible');
	});

	it('says no rate exists for 1000, −3000, 2500 (Brealey and Myers)', () => {
		const a = analyseDeal(periodic(['1000', '-3000', '2500']));
		expect(a.result.status).toBe('no-root');
		expect(a.rates).toEqual([]);
		expect(a.result.reason?.message).toContain('never changes sign');
	});

	it('states a monthly rate per period, nominal and effective per year (common practice)', () => {
		// 1% a month for 12 months on an annuity: nominal 12%, effective 1.01^12 − 1 = 12.682503…%.
		const payment = new Decimal(1000)
			.times(0.01)
			.div(new Decimal(1).minus(new Decimal(1.01).pow(-12)));
		const flows = ['-1000', ...Array.from({ length: 12 }, () => payment.toFixed(12))];
		const a = analyseDeal(periodic(flows, { periodsPerYear: 12 }));
		const r = a.rates[0];
		expect(new Decimal(r.perPeriod!).toDecimalPlaces(10).toString()).toBe('0.01');
		expect(new Decimal(r.nominalAnnual!).toDecimalPlaces(10).toString()).toBe('0.12');
		expect(new Decimal(r.effectiveAnnual).toDecimalPlaces(9).toString()).toBe('0.12682503');
	});

	it('flips every sign in the borrower view', () => {
		const investor = analyseDeal(periodic(['-1000', '1100']));
		const borrower = analyseDeal(periodic(['1000', '-1100'], { signConvention: 'borrower' }));
		expect(borrower.rates[0].perPeriod).toBe(investor.rates[0].perPeriod);
		expect(borrower.npvAtHurdle).toBe(investor.npvAtHurdle);
	});
});
