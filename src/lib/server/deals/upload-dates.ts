/*
 * Reading dates from cells. Year-first forms and month names are read directly; day and month
 * before the year are read only when one order is possible (25/12/2026), and the column must
 * keep to one order. An ambiguous form (03/04/2026) is refused with a request for YYYY-MM-DD,
 * never guessed, though the message says what the column's other rows suggest.
 */

import { cellText, plainNumber, utcDateText, type SheetCell, type SheetRow } from './upload-sheet';
import { fail, notAValue, quoted, type Reading } from './upload-values';

const FIRST_YEAR = 1900;
const LAST_YEAR = 2200;
/** Serials before this day are off by one in the 1900 date system (its phantom 29 Feb 1900). */
const FIRST_RELIABLE_SERIAL_DAY = Date.UTC(1900, 2, 1);
const MS_PER_DAY = 86_400_000;
const BLANK: SheetCell = { kind: 'blank' };

export type DateOrder = 'day-first' | 'month-first';

export interface DateValue {
	/** YYYY-MM-DD. */
	date: string;
	/** Set when the text put day and month before the year in an order only one reading allows. */
	order?: DateOrder;
}

export type DateReading =
	| { ok: true; value: DateValue }
	| { ok: false; message: string; ambiguous?: { dayFirst: string; monthFirst: string } };

const MONTHS = [
	'january',
	'february',
	'march',
	'april',
	'may',
	'june',
	'july',
	'august',
	'september',
	'october',
	'november',
	'december'
];

function monthFromName(name: string): number | null {
	const word = name.toLowerCase();
	if (word.length < 3) return null;
	if (word === 'sept') return 9;
	const index = MONTHS.findIndex((month) => month.startsWith(word));
	return index >= 0 ? index + 1 : null;
}

/** YYYY-MM-DD if year, month and day name a real date in range, else a message. */
function calendarDate(text: string, year: number, month: number, day: number): Reading<string> {
	const date = new Date(Date.UTC(year, month - 1, day));
	const real =
		month >= 1 &&
		month <= 12 &&
		date.getUTCFullYear() === year &&
		date.getUTCMonth() === month - 1 &&
		date.getUTCDate() === day;
	if (!real) return fail(`${quoted(text)} is not a calendar date.`);
	if (year < FIRST_YEAR || year > LAST_YEAR) {
		return fail(`${quoted(text)} is outside the years ${FIRST_YEAR} to ${LAST_YEAR}.`);
	}
	return { ok: true, value: date.toISOString().slice(0, 10) };
}

function spelled(year: number, month: number, day: number): string {
	return `${day} ${MONTHS[month - 1][0].toUpperCase()}${MONTHS[month - 1].slice(1)} ${year}`;
}

function dateFromText(raw: string): DateReading {
	const timed = /^(.*?)[T ](\d{1,2}):(\d{2})(?::(\d{2})(?:\.\d+)?)?Z?$/.exec(raw);
	const text = timed ? timed[1].trim() : raw;
	if (timed && Number(timed[2]) + Number(timed[3]) + Number(timed[4] ?? 0) !== 0) {
		return fail(`${quoted(raw)} has a time of day; flows are dated by the day. Remove the time.`);
	}
	const yearFirst = /^(\d{4})([-/.])(\d{1,2})\2(\d{1,2})$/.exec(text);
	if (yearFirst) {
		const date = calendarDate(raw, +yearFirst[1], +yearFirst[3], +yearFirst[4]);
		return date.ok ? { ok: true, value: { date: date.value } } : date;
	}
	const yearLast = /^(\d{1,2})([-/.])(\d{1,2})\2(\d{2}|\d{4})$/.exec(text);
	if (yearLast) {
		const [a, b, year] = [+yearLast[1], +yearLast[3], yearLast[4]];
		if (year.length === 2) {
			return fail(`${quoted(raw)} has a two-digit year. Write dates as YYYY-MM-DD.`);
		}
		const y = +year;
		if (a <= 12 && b <= 12 && a !== b) {
			const dayFirst = calendarDate(raw, y, b, a);
			const monthFirst = calendarDate(raw, y, a, b);
			if (!dayFirst.ok) return dayFirst;
			if (!monthFirst.ok) return monthFirst;
			return {
				ok: false,
				message: `${quoted(raw)} could be ${spelled(y, b, a)} or ${spelled(y, a, b)}. Write dates as YYYY-MM-DD (${dayFirst.value} or ${monthFirst.value}).`,
				ambiguous: { dayFirst: dayFirst.value, monthFirst: monthFirst.value }
			};
		}
		const order: DateOrder | undefined = a > 12 ? 'day-first' : b > 12 ? 'month-first' : undefined;
		const date = order === 'month-first' ? calendarDate(raw, y, a, b) : calendarDate(raw, y, b, a);
		if (!date.ok) return date;
		return { ok: true, value: order ? { date: date.value, order } : { date: date.value } };
	}
	const dayName = /^(\d{1,2})[\s-]+([a-z]+)\.?[\s,-]+(\d{2,4})$/i.exec(text);
	const nameDay = /^([a-z]+)\.?[\s-]+(\d{1,2}),?[\s-]+(\d{2,4})$/i.exec(text);
	const named = dayName
		? { day: dayName[1], month: dayName[2], year: dayName[3] }
		: nameDay
			? { day: nameDay[2], month: nameDay[1], year: nameDay[3] }
			: null;
	const namedMonth = named ? monthFromName(named.month) : null;
	if (named && namedMonth !== null) {
		if (named.year.length !== 4) {
			return fail(`${quoted(raw)} needs a four-digit year. Write dates as YYYY-MM-DD.`);
		}
		const date = calendarDate(raw, +named.year, namedMonth, +named.day);
		return date.ok ? { ok: true, value: { date: date.value } } : date;
	}
	if (/^\d{4,6}(\.\d+)?$/.test(text)) {
		return fail(
			`${quoted(raw)} looks like a spreadsheet day number, not a date. Format the column as dates or write them as YYYY-MM-DD.`
		);
	}
	return fail(
		`${quoted(raw)} is not a date Pincer can read. Write dates as YYYY-MM-DD, for example 2026-03-01 (1 Mar 2026 and Mar 1, 2026 also work).`
	);
}

/**
 * A date from a cell: xlsx date cells (serials are read as UTC midnight), or text as
 * YYYY-MM-DD (also YYYY-M-D, YYYY/MM/DD), with a month name, or day and month before the year
 * when only one order is possible. Years 1900 to 2200.
 */
export function readDate(cell: SheetCell): DateReading {
	const refused = notAValue(cell);
	if (refused) return fail(refused);
	switch (cell.kind) {
		case 'text':
			return dateFromText(cell.text);
		case 'date': {
			if (cell.time % MS_PER_DAY !== 0) {
				return fail(
					`This cell holds a date with a time of day (${utcDateText(cell.time)}); flows are dated by the day. Remove the time.`
				);
			}
			const date = utcDateText(cell.time);
			if (cell.time < FIRST_RELIABLE_SERIAL_DAY) {
				return fail(
					`Spreadsheet dates before 1900-03-01 are off by one day; write this date as text, YYYY-MM-DD.`
				);
			}
			const year = Number(date.slice(0, 4));
			if (year > LAST_YEAR) {
				return fail(`${date} is outside the years ${FIRST_YEAR} to ${LAST_YEAR}.`);
			}
			return { ok: true, value: { date } };
		}
		case 'number':
			return fail(
				`This cell holds the number ${plainNumber(cell.value)}, not a date. Format the column as dates or write them as YYYY-MM-DD.`
			);
		default:
			return fail(`This cell holds ${quoted(cellText(cell))}, not a date.`);
	}
}

// ---- a column of dates ----

export type Evidence = Partial<Record<DateOrder, { row: number; text: string }>>;

/** The first row of each order in which day and month before the year can only be read one way. */
export function dateOrderEvidence(rows: SheetRow[], column: number): Evidence {
	const evidence: Evidence = {};
	for (const row of rows) {
		const cell = row.cells[column] ?? BLANK;
		if (cell.kind !== 'text') continue;
		const reading = readDate(cell);
		const order = reading.ok ? reading.value.order : undefined;
		if (order && !evidence[order]) evidence[order] = { row: row.number, text: cell.text };
	}
	return evidence;
}

const firstOf = (order: DateOrder) => (order === 'day-first' ? 'day' : 'month');

/** A date, refusing a day/month order that contradicts the column's first unambiguous one. */
export function flowDate(cell: SheetCell, evidence: Evidence): Reading<string> {
	const reading = readDate(cell);
	const known = Object.keys(evidence) as DateOrder[];
	if (!reading.ok) {
		if (reading.ambiguous && known.length === 1) {
			const seen = evidence[known[0]];
			const date =
				known[0] === 'day-first' ? reading.ambiguous.dayFirst : reading.ambiguous.monthFirst;
			return {
				ok: false,
				message: `${reading.message} Row ${seen?.row} (${JSON.stringify(seen?.text)}) puts the ${firstOf(known[0])} first, which would make this ${date}.`
			};
		}
		return reading;
	}
	const order = reading.value.order;
	const day = evidence['day-first'];
	const month = evidence['month-first'];
	if (order && day && month) {
		const established: DateOrder = day.row < month.row ? 'day-first' : 'month-first';
		const seen = established === 'day-first' ? day : month;
		if (order !== established) {
			return {
				ok: false,
				message: `${JSON.stringify(cellText(cell))} puts the ${firstOf(order)} first, but row ${seen.row} (${JSON.stringify(seen.text)}) puts the ${firstOf(established)} first. Write dates as YYYY-MM-DD.`
			};
		}
	}
	return { ok: true, value: reading.value.date };
}
