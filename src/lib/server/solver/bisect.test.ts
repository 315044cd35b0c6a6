import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { bisect, bisectionBound, type Evaluate } from './bisect';
import { Dec } from './decimal';
import { solve } from './solve';
import { resolveStopRules } from './stop-rules';

const linear =
	(root: string): Evaluate =>
	(x) => ({ value: x.minus(root), bound: new Dec(0) });

function start(evaluate: Evaluate, low: string, high: string) {
	const a = new Dec(low);
	const b = new Dec(high);
	return { low: a, high: b, atLow: evaluate(a), atHigh: evaluate(b) };
}

describe('bisection', () => {
	it('on [0, 1] to ε = 1e-6 predicts and takes 19 iterations', () => {
		const f = linear('0.3');
		const run = bisect(f, start(f, '0', '1'), resolveStopRules({ rateTolerance: '1e-6' }), true);
		expect(run.predictedIterations).toBe(19);
		expect(run.iterations).toBe(19);
		expect(run.stoppedBy).toBe('rate-tolerance');
		expect(run.point.minus('0.3').abs().lte('1e-6')).toBe(true);
		expect(run.errorBound.lte('1e-6')).toBe(true);
	});

	it('halves the error bound at every step', () => {
		const f = linear('0.123456789');
		const run = bisect(f, start(f, '0', '1'), resolveStopRules({ rateTolerance: '1e-9' }), true);
		run.trace.forEach((step, k) => {
			const width = step.high.minus(step.low);
			expect(width.eq(new Dec(1).div(new Dec(2).pow(k)))).toBe(true);
			// After k + 1 steps the midpoint is within 1/2^(k+2) of the root.
			expect(bisectionBound(new Dec(1), k + 1).eq(width.div(4))).toBe(true);
		});
	});

	it('takes the textbook count through solve with an explicit bracket', () => {
		// NPV(r) = -1 + 1.3/(1 + r) has its root at 30%.
		const result = solve({
			kind: 'irr',
			flows: ['-1', '1.3'],
			method: 'bisection',
			bracket: { low: '0', high: '1' },
			stop: { rateTolerance: '1e-6' },
			trace: true
		});
		expect(result.status).toBe('solved');
		expect(result.iterations).toBe(19);
		expect(result.predictedIterations).toBe(19);
		expect(result.trace).toHaveLength(19);
		expect(Math.abs(Number(result.rate) - 0.3)).toBeLessThanOrEqual(1e-6);
	});

	it('stops on the cap with the bracket it has, and says so', () => {
		const f = linear('0.3');
		const run = bisect(f, start(f, '0', '1'), resolveStopRules({ maxIterations: 5 }));
		expect(run.stoppedBy).toBe('iteration-cap');
		expect(run.iterations).toBe(5);
		expect(run.low.lte('0.3') && run.high.gte('0.3')).toBe(true);
	});

	it('never loses the root (property)', () => {
		fc.assert(
			fc.property(fc.double({ min: 0.001, max: 0.999, noNaN: true }), (root) => {
				const f = linear(String(root));
				const run = bisect(f, start(f, '0', '1'), resolveStopRules({ rateTolerance: '1e-10' }));
				return (
					run.low.lte(root) && run.high.gte(root) && run.iterations === run.predictedIterations
				);
			}),
			{ numRuns: 30 }
		);
	});
});
