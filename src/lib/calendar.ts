/** Calendar dates written `YYYY-MM-DD`, read without Date objects (no time zones involved). */

export interface CalendarDate {
	year: number;
	month: number; // 1..12
	day: number; // 1..31
}

export function isLeapYear(year: number): boolean {
	return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

const MONTH_LENGTHS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

export function daysInMonth(year: number, month: number): number {
	return month === 2 && isLeapYear(year) ? 29 : MONTH_LENGTHS[month - 1];
}

/** The digit at `i`, or NaN when the character there is not 0–9. */
function digitAt(text: string, i: number): number {
	const code = text.charCodeAt(i) - 48;
	return code >= 0 && code <= 9 ? code : NaN;
}

/**
 * Year, month and day of text written exactly `YYYY-MM-DD` (four, two and two digits), or null
 * for any other text. The numbers are not checked against the calendar (see isRealDate).
 * Called for every flow of every request, so it reads character codes instead of splitting.
 */
export function readIsoDate(text: string): CalendarDate | null {
	if (text.length !== 10 || text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45) return null;
	const year =
		digitAt(text, 0) * 1000 + digitAt(text, 1) * 100 + digitAt(text, 2) * 10 + digitAt(text, 3);
	const month = digitAt(text, 5) * 10 + digitAt(text, 6);
	const day = digitAt(text, 8) * 10 + digitAt(text, 9);
	return Number.isNaN(year + month + day) ? null : { year, month, day };
}

/** Whether the date exists in the (proleptic Gregorian) calendar. */
export function isRealDate({ year, month, day }: CalendarDate): boolean {
	return month >= 1 && month <= 12 && day >= 1 && day <= daysInMonth(year, month);
}
