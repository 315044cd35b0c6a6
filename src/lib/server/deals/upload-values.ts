/*
 * Reading one cell as an amount, a period or a label, with a message a person can act on when
 * it cannot be read. Nothing here guesses: a form that could mean two things is refused.
 */

import { cellText, plainNumber, utcDateText, type SheetCell } from './upload-sheet';

export type Reading<T> = { ok: true; value: T } | { ok: false; message: string };

/** Amount limits of the solve request: 24 digits before the point, 12 after. */
export const MAX_WHOLE_DIGITS = 24;
export const MAX_FRACTION_DIGITS = 12;
/** Largest period number accepted in periodic mode. */
export const MAX_PERIOD = 100_000;

export const fail = (message: string): { ok: false; message: string } => ({ ok: false, message });
export const quoted = (text: string) => JSON.stringify(text);

/**
 * The message for a cell that holds no plain value (formula, error value, merged cell), or
 * null. Formulas are never evaluated, and a cached result is not trusted either.
 */
export function notAValue(cell: SheetCell): string | null {
	switch (cell.kind) {
		case 'formula':
			return `This cell holds a formula (=${cell.formula}), not a value. Pincer never evaluates formulas: copy the column, paste it back as values only, and upload again.`;
		case 'error':
			return `This cell holds the spreadsheet error ${cell.code}, not a value.`;
		case 'merged':
			return `This cell is part of cells merged into ${cell.master}; unmerge them so that every row holds its own value.`;
		default:
			return null;
	}
}

// ---- amounts ----

export interface AmountValue {
	/** Exact decimal string: optional minus, digits, optional point and digits. */
	amount: string;
	/** Currency symbol that was stripped, if any. */
	currency?: string;
}

const AMOUNT_SHAPE =
	/^([+\-\u2212]?)\s*(\p{Sc}?)\s*([+\-\u2212]?)\s*(\d[\d,]*(?:\.\d*)?|\.\d+)\s*(\p{Sc}?)$/u;
const GROUPED = /^\d{1,3}(,\d{3})+(\.\d*)?$/;
const badGrouping = (text: string) =>
	`${quoted(text)} is not an amount: a comma may only group thousands (three digits at a time, as in 1,234.56), and the decimal mark must be a point.`;

/** Builds the canonical string from a sign and the digits before and after the point. */
function canonicalAmount(negative: boolean, whole: string, fraction: string): Reading<string> {
	const digits = whole.replace(/^0+(?=\d)/, '');
	if (digits.length > MAX_WHOLE_DIGITS) {
		return fail(
			`has ${digits.length} digits before the decimal point; amounts may have at most ${MAX_WHOLE_DIGITS}.`
		);
	}
	if (fraction.length > MAX_FRACTION_DIGITS) {
		return fail(
			`has ${fraction.length} decimal places; amounts may have at most ${MAX_FRACTION_DIGITS}. Round the column in the spreadsheet (for example to cents) and upload again.`
		);
	}
	const body = fraction === '' ? digits : `${digits}.${fraction}`;
	const zero = /^[0.]*$/.test(body);
	return { ok: true, value: negative && !zero ? `-${body}` : body };
}

function amountFromText(text: string, semicolonFile: boolean): Reading<AmountValue> {
	let body = text;
	let parenthesised = false;
	if (body.startsWith('(') && body.endsWith(')')) {
		parenthesised = true;
		body = body.slice(1, -1).trim();
	}
	const shape = AMOUNT_SHAPE.exec(body);
	if (!shape) {
		if (/^[+-]?(\d+\.?\d*|\.\d+)e[+-]?\d+$/i.test(body)) {
			return fail(
				`${quoted(text)} is in scientific notation; format the column as a number showing all its digits.`
			);
		}
		if (/^\(?\p{Sc}?[\d,.]+\p{Sc}?-\)?$/u.test(body)) {
			return fail(`${quoted(text)} has its minus sign at the end; write -1234.56 or (1234.56).`);
		}
		if (/^[+\-\u2212]?\p{Sc}?\d[\d,.]*\p{Sc}?$/u.test(body)) return fail(badGrouping(text));
		return fail(
			`${quoted(text)} is not an amount. Write amounts such as -1000, 1,234.56 or (250.00).`
		);
	}
	const [, sign1, symbol1, sign2, number, symbol2] = shape;
	const signs = [sign1, sign2].filter((s) => s !== '');
	if (signs.length > 1 || (symbol1 && symbol2) || (parenthesised && signs.length > 0)) {
		return fail(
			`${quoted(text)} has more than one sign or currency mark; write it as -1234.56 or (1234.56).`
		);
	}
	let digits = number;
	if (digits.includes(',')) {
		if (!GROUPED.test(digits)) {
			return fail(badGrouping(text));
		}
		if (semicolonFile && !digits.includes('.')) {
			return fail(
				`${quoted(text)} is ambiguous in a semicolon-separated file, where a comma is often the decimal mark. Write it without grouping, with a point as the decimal mark (1234 or 1.234).`
			);
		}
		digits = digits.replace(/,/g, '');
	}
	const [whole, fraction = ''] = digits.split('.');
	const negative = parenthesised || signs[0] === '-' || signs[0] === '\u2212';
	const amount = canonicalAmount(negative, whole === '' ? '0' : whole, fraction);
	if (!amount.ok) return fail(`${quoted(text)} ${amount.message}`);
	const currency = symbol1 || symbol2;
	return {
		ok: true,
		value: currency ? { amount: amount.value, currency } : { amount: amount.value }
	};
}

/**
 * An amount from a cell. Text may use comma thousands groups, a leading + or −, parentheses
 * for a negative and one currency symbol (stripped, not converted). An xlsx number becomes the
 * shortest decimal that reads back as the same double, so 0.1 stays "0.1".
 */
export function readAmount(cell: SheetCell, semicolonFile: boolean): Reading<AmountValue> {
	const refused = notAValue(cell);
	if (refused) return fail(refused);
	switch (cell.kind) {
		case 'text':
			return amountFromText(cell.text, semicolonFile);
		case 'number': {
			const plain = plainNumber(cell.value);
			const [whole, fraction = ''] = plain.replace('-', '').split('.');
			const amount = canonicalAmount(plain.startsWith('-'), whole, fraction);
			if (!amount.ok)
				return fail(`The number ${plain} (as the workbook stores it) ${amount.message}`);
			return { ok: true, value: { amount: amount.value } };
		}
		case 'date':
			return fail(`This cell holds a date (${utcDateText(cell.time)}), not an amount.`);
		default:
			return fail(`This cell holds ${quoted(cellText(cell))}, not an amount.`);
	}
}

// ---- periods ----

/** A period number: a whole number from 0 to MAX_PERIOD, as a number cell or digits. */
export function readPeriod(cell: SheetCell): Reading<number> {
	const refused = notAValue(cell);
	if (refused) return fail(refused);
	const shown = cellText(cell);
	let value: number;
	if (cell.kind === 'number') value = cell.value;
	else if (cell.kind === 'text' && /^[+-]?\d+$/.test(cell.text)) value = Number(cell.text);
	else if (cell.kind === 'text' && /^[+-]?(\d+\.\d*|\.\d+)$/.test(cell.text)) {
		return fail(`${quoted(shown)} has a decimal point; write periods as whole numbers 0, 1, 2, …`);
	} else {
		return fail(`${quoted(shown)} is not a period number; write whole numbers 0, 1, 2, …`);
	}
	if (!Number.isInteger(value)) return fail(`${quoted(shown)} is not a whole number of periods.`);
	if (value < 0) return fail(`Periods start at 0; ${shown} is negative.`);
	if (value > MAX_PERIOD) return fail(`${shown} is beyond the last period allowed, ${MAX_PERIOD}.`);
	return { ok: true, value: value === 0 ? 0 : value }; // no -0
}

/** A label: the cell's text (numbers and dates as shown), or undefined when blank. */
export function readLabel(cell: SheetCell): Reading<string | undefined> {
	const refused = notAValue(cell);
	if (refused) return fail(refused);
	const text = cellText(cell);
	return { ok: true, value: text === '' ? undefined : text };
}
