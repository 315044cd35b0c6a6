import * as formulajs from '@formulajs/formulajs';
import Decimal from 'decimal.js';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { Dec } from './decimal';
import { datedNpv, equalPeriodSchedule, evaluateDecimal, npv } from './npv';
import { evaluateFloat } from './npv-float';
import { buildSchedule } from './schedule';

// Independent reference: a direct sum Σ a / ((1 + f·x)(1 + x)^(t/N)) at 60 digits.
const Wide = Decimal.clone({ precision: 60 });
type Term = { ticks: number; amount: string; f?: [number, number] };
function directSum(terms: Term[], perUnit: number, rate: string) {
	const onePlus = new Wide(1).plus(rate);
	return terms.reduce((sum, term) => {
		const simple = term.f ? new Wide(1).plus(new Wide(term.f[0]).div(term.f[1]).times(rate)) : 1;
		const discount = onePlus.pow(new Wide(term.ticks).div(perUnit)).times(simple);
		return sum.plus(new Wide(term.amount).div(discount));
	}, new Wide(0));
}

describe('decimal NPV', () => {
	it('matches a direct sum, runs and fractions included (property)', () => {
		const term = fc.record({
			ticks: fc.integer({ min: 0, max: 400 }),
			amount: fc.integer({ min: -5000, max: 5000 }).map((n) => (n / 100).toFixed(2)),
			f: fc.option(fc.tuple(fc.integer({ min: 1, max: 29 }), fc.constant(30)), { nil: undefined })
		});
		const run = fc.record({
			start: fc.integer({ min: 0, max: 50 }),
			count: fc.integer({ min: 4, max: 60 })
		});
		fc.assert(
			fc.property(
				fc.array(term, { minLength: 1, maxLength: 12 }),
				run,
				fc.constantFrom(1, 12, 365),
				fc.constantFrom('-0.9', '-0.3', '0', '0.0001', '0.05', '2.5'),
				(terms, stretch, perUnit, rate) => {
					const all: Term[] = [
						...terms,
						...Array.from({ length: stretch.count }, (_, k) => ({
							ticks: stretch.start + k,
							amount: '12.34'
						}))
					];
					const schedule = buildSchedule(
						all.map((t) => ({
							ticks: t.ticks,
							amount: new Dec(t.amount),
							fraction: t.f ? { numerator: t.f[0], denominator: t.f[1] } : undefined
						})),
						perUnit,
						1
					);
					const got = evaluateDecimal(schedule, new Dec(rate));
					const want = directSum(all, perUnit, rate);
					const scale = Decimal.max(1, want.abs());
					return new Decimal(got.value.toString()).minus(want).abs().lte(scale.times('1e-25'));
				}
			),
			{ numRuns: 40 }
		);
	});

	it('does not overflow at −99% over 1,200 periods, in decimal or float64', () => {
		const flows = ['-100', ...Array.from({ length: 1199 }, () => '0.5'), '100.5'];
		const schedule = equalPeriodSchedule(flows);
		const value = evaluateDecimal(schedule, new Dec('-0.99')).value;
		expect(value.isFinite()).toBe(true);
		expect(value.gt('1e2000')).toBe(true); // 100.5 · 100^1200 dominates
		const float = evaluateFloat(schedule, Math.log(0.01));
		expect(Number.isFinite(float.value) && float.value > 0).toBe(true);
		expect(Number.isFinite(float.logScale)).toBe(true);
	});

	it('agrees with the float64 reference NPV for ordinary cases', () => {
		const flows = ['-1000', '300', '400', '500', '120.55'];
		// The reference discounts its first value by one period; ours starts at period 0.
		const reference = -1000 + (formulajs.NPV(0.07, flows.slice(1).map(Number)) as number);
		expect(Number(npv(flows, '0.07'))).toBeCloseTo(reference, 9);
		const dated = [
			{ date: '2024-01-01', amount: '-1000' },
			{ date: '2024-03-15', amount: '250' },
			{ date: '2025-06-30', amount: '900' }
		];
		const datedReference = formulajs.XNPV(
			0.09,
			dated.map((f) => Number(f.amount)),
			dated.map((f) => new Date(`${f.date}T00:00:00Z`))
		) as number;
		expect(Number(datedNpv(dated, '0.09'))).toBeCloseTo(datedReference, 9);
	});

	it('rejects rates at or below −100%', () => {
		expect(() => npv(['-1', '2'], '-1')).toThrow(RangeError);
	});
});
