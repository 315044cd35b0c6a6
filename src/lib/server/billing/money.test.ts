import { describe, expect, it } from 'vitest';
import { fromMinorUnits, minorDigits } from './money';

describe('minor units to decimal strings', () => {
	it('shifts cents exactly, keeping two places', () => {
		expect(fromMinorUnits(2900, 'usd')).toBe('29.00');
		expect(fromMinorUnits(14500, 'USD')).toBe('145.00');
		expect(fromMinorUnits(1, 'eur')).toBe('0.01');
		expect(fromMinorUnits(0, 'usd')).toBe('0.00');
		expect(fromMinorUnits(-1999, 'usd')).toBe('-19.99');
	});

	it('is exact where a float division is not', () => {
		// Sixteen significant digits: more than a double carries through a division by 100.
		expect(fromMinorUnits(1000000000000001, 'usd')).toBe('10000000000000.01');
		expect(fromMinorUnits('2900.5', 'usd')).toBe('29.005');
	});

	it('leaves zero-decimal currencies whole', () => {
		expect(minorDigits('JPY')).toBe(0);
		expect(fromMinorUnits(3200, 'jpy')).toBe('3200');
	});
});
