import { describe, expect, it } from 'vitest';
import { isRealDate, readIsoDate } from './calendar';

describe('readIsoDate', () => {
	it('reads YYYY-MM-DD digits', () => {
		expect(readIsoDate('2025-01-17')).toEqual({ year: 2025, month: 1, day: 17 });
		expect(readIsoDate('1900-12-31')).toEqual({ year: 1900, month: 12, day: 31 });
	});

	it.each([
		'2025-1-17',
		'2025-01-7',
		'25-01-17',
		'2025/01/17',
		'2025-01-17T00',
		'20a5-01-17',
		'2025-0x-17',
		'２０２５-01-17',
		' 2025-01-1',
		''
	])('refuses %j', (text) => expect(readIsoDate(text)).toBeNull());
});

describe('isRealDate', () => {
	// Gregorian leap years: every 4th year, except centuries not divisible by 400.
	it.each([
		['2024-02-29', true],
		['2023-02-29', false],
		['2000-02-29', true],
		['1900-02-29', false],
		['2025-04-30', true],
		['2025-04-31', false],
		['2025-12-31', true],
		['2025-13-01', false],
		['2025-00-10', false],
		['2025-01-00', false]
	])('%s exists: %s', (text, exists) => {
		const date = readIsoDate(text);
		expect(date).not.toBeNull();
		expect(isRealDate(date!)).toBe(exists);
	});
});
