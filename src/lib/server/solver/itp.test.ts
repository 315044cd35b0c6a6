import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { bisect, type Evaluate } from './bisect';
import { Dec } from './decimal';
import { ITP_SLACK, itp } from './itp';
import { resolveStopRules } from './stop-rules';

function start(evaluate: Evaluate, low: string, high: string) {
	const a = new Dec(low);
	const b = new Dec(high);
	return { low: a, high: b, atLow: evaluate(a), atHigh: evaluate(b) };
}

// NPV-like test functions: f(x) = c0 + c1/(1+x) + c2/(1+x)^2 with one root in the bracket.
const annuity =
	(payment: number, periods: number): Evaluate =>
	(x) => {
		const v = new Dec(1).div(x.plus(1));
		let sum = new Dec(-1000);
		let factor = new Dec(1);
		for (let k = 1; k <= periods; k += 1) {
			factor = factor.times(v);
			sum = sum.plus(factor.times(payment));
		}
		return { value: sum, bound: new Dec(0) };
	};

describe('ITP (Oliveira and Takahashi 2020)', () => {
	it('needs far fewer steps than bisection on a smooth NPV and never exceeds its bound', () => {
		const f = annuity(90, 24);
		const rules = resolveStopRules({ rateTolerance: '1e-12' });
		const byItp = itp(f, start(f, '0', '1'), rules);
		const byBisection = bisect(f, start(f, '0', '1'), rules);
		expect(byBisection.iterations).toBe(byBisection.predictedIterations);
		expect(byItp.iterations).toBeLessThan(byBisection.iterations / 2);
		expect(byItp.iterationBound).toBe((byBisection.predictedIterations ?? 0) + ITP_SLACK);
		expect(byItp.point.minus(byBisection.point).abs().lte('2e-12')).toBe(true);
	});

	it('never exceeds bisection’s count plus n0 (property)', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 45, max: 400 }),
				fc.integer({ min: 2, max: 60 }),
				fc.constantFrom('1e-6', '1e-12', '1e-20'),
				(payment, periods, tolerance) => {
					const f = annuity(payment, periods);
					const begin = start(f, '-0.5', '2');
					if (begin.atLow.value.isNeg() === begin.atHigh.value.isNeg()) return true;
					const run = itp(f, begin, resolveStopRules({ rateTolerance: tolerance }));
					return (
						run.iterations <= run.iterationBound &&
						run.iterationBound === (run.predictedIterations ?? 0) + ITP_SLACK &&
						run.high.minus(run.low).lte(new Dec(tolerance).times(2))
					);
				}
			),
			{ numRuns: 25 }
		);
	});
});
