import { describe, expect, it } from 'vitest';
import { Dec, bisectionCount, percentHalfUp, powerOfTen } from './decimal';

describe('decimal helpers', () => {
	it('counts bisection steps as the smallest n with n > log2(w / 2ε)', () => {
		// [0, 1] to ε = 1e-6: log2(1 / 2e-6) = 18.93, so 19 steps (the textbook count).
		expect(bisectionCount(new Dec(1), new Dec('1e-6'))).toBe(19);
		// Width exactly 2ε·2^k needs k + 1 steps under the strict inequality.
		expect(bisectionCount(new Dec(8), new Dec('0.5'))).toBe(4);
		expect(bisectionCount(new Dec('0.5'), new Dec('1e-12'))).toBe(38);
		// Already narrower than 2ε: nothing to do.
		expect(bisectionCount(new Dec('1e-12'), new Dec('1e-12'))).toBe(0);
	});

	it('rounds disclosures half-up from the full value', () => {
		expect(percentHalfUp(new Dec('0.128250'), 2)).toBe('12.83');
		expect(percentHalfUp(new Dec('0.1282499999'), 2)).toBe('12.82');
		expect(percentHalfUp(new Dec('0.12950'), 1)).toBe('13.0');
		expect(percentHalfUp(new Dec('0.12949'), 1)).toBe('12.9');
	});

	it('builds powers of ten for rounding bounds', () => {
		expect(powerOfTen(-30.2).eq('1e-30')).toBe(true);
		expect(powerOfTen(-Infinity).isZero()).toBe(true);
	});
});
