/*
 * An uploaded file as one grid of typed cells, whatever its format. CSV cells are all text;
 * xlsx cells keep the type the workbook stored (number, date, formula, …) so that formulas and
 * error values can be reported instead of silently read. Blank rows are dropped here; every
 * kept row carries its number as the spreadsheet shows it.
 */

import ExcelJS from 'exceljs';
import { Dec } from '../solver/decimal';
import { decodeText, detectDelimiter, parseCsv, type CsvDelimiter } from './upload-csv';
import { checkZipExpansion, MAX_EXPANDED_BYTES } from './zip-guard';

/** One problem with an upload: the spreadsheet row (header = row 1) and column name if known. */
export interface UploadError {
	row?: number;
	column?: string;
	message: string;
}

export type SheetCell =
	| { kind: 'blank' }
	| { kind: 'text'; text: string }
	| { kind: 'number'; value: number }
	/** An xlsx date cell, as milliseconds since 1970-01-01 UTC (serials read as UTC). */
	| { kind: 'date'; time: number }
	| { kind: 'formula'; formula: string }
	| { kind: 'boolean'; value: boolean }
	| { kind: 'error'; code: string }
	/** Covered by a merged range whose value sits in `master` (an address such as A8). */
	| { kind: 'merged'; master: string };

export interface SheetRow {
	/** Row number as the spreadsheet shows it (1 for the first row). */
	number: number;
	cells: SheetCell[];
}

export interface Sheet {
	format: 'csv' | 'xlsx';
	/** Name of the worksheet read (xlsx only). */
	sheetName?: string;
	/** Delimiter found in the header line (CSV only). */
	delimiter?: CsvDelimiter;
	/** Non-blank rows in file order. */
	rows: SheetRow[];
}

export type SheetRead = { ok: true; sheet: Sheet } | { ok: false; errors: UploadError[] };

const BLANK: SheetCell = { kind: 'blank' };
const MS_PER_DAY = 86_400_000;

function textCell(raw: string): SheetCell {
	const text = raw.trim();
	return text === '' ? BLANK : { kind: 'text', text };
}

function isBlankRow(cells: SheetCell[]): boolean {
	return cells.every((cell) => cell.kind === 'blank');
}

/** Spreadsheet column letters for a zero-based index: 0 → A, 26 → AA. */
export function columnLetter(index: number): string {
	let letters = '';
	for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) {
		letters = String.fromCharCode(65 + ((n - 1) % 26)) + letters;
	}
	return letters;
}

/** Shortest decimal string that reads back as the same double, in plain notation. */
export function plainNumber(value: number): string {
	return new Dec(String(value)).toFixed();
}

/** YYYY-MM-DD of a UTC time, with HH:MM:SS appended when it is not midnight. */
export function utcDateText(time: number): string {
	const iso = new Date(time).toISOString();
	return time % MS_PER_DAY === 0 ? iso.slice(0, 10) : `${iso.slice(0, 10)} ${iso.slice(11, 19)}`;
}

/** What a cell shows, as text: formulas as =…, dates as YYYY-MM-DD. */
export function cellText(cell: SheetCell): string {
	switch (cell.kind) {
		case 'blank':
		case 'merged':
			return '';
		case 'text':
			return cell.text;
		case 'number':
			return plainNumber(cell.value);
		case 'date':
			return utcDateText(cell.time);
		case 'formula':
			return `=${cell.formula}`;
		case 'boolean':
			return cell.value ? 'TRUE' : 'FALSE';
		case 'error':
			return cell.code;
	}
}

/** Reads a CSV (or tab-separated) file into the grid; all cells are text. */
export function csvSheet(bytes: Uint8Array): SheetRead {
	const decoded = decodeText(bytes);
	if (!decoded.ok) return decoded;
	const delimiter = detectDelimiter(decoded.text);
	const parsed = parseCsv(decoded.text, delimiter);
	if (!parsed.ok) return parsed;
	const rows: SheetRow[] = [];
	parsed.records.forEach((fields, index) => {
		const cells = fields.map(textCell);
		if (!isBlankRow(cells)) rows.push({ number: index + 1, cells });
	});
	return { ok: true, sheet: { format: 'csv', delimiter, rows } };
}

function xlsxCell(cell: ExcelJS.Cell): SheetCell {
	const value = cell.value;
	switch (cell.type) {
		case ExcelJS.ValueType.Number:
			return { kind: 'number', value: value as number };
		case ExcelJS.ValueType.String:
		case ExcelJS.ValueType.SharedString:
			return textCell(String(value));
		case ExcelJS.ValueType.RichText:
			return textCell((value as ExcelJS.CellRichTextValue).richText.map((r) => r.text).join(''));
		case ExcelJS.ValueType.Hyperlink:
			return textCell(String((value as ExcelJS.CellHyperlinkValue).text ?? ''));
		case ExcelJS.ValueType.Date:
			return { kind: 'date', time: (value as Date).getTime() };
		case ExcelJS.ValueType.Formula:
			return { kind: 'formula', formula: cell.formula ?? '' };
		case ExcelJS.ValueType.Boolean:
			return { kind: 'boolean', value: value as boolean };
		case ExcelJS.ValueType.Error:
			return { kind: 'error', code: (value as ExcelJS.CellErrorValue).error };
		case ExcelJS.ValueType.Merge:
			return cell.isMerged && cell.master.address !== cell.address
				? { kind: 'merged', master: cell.master.address }
				: BLANK;
		default:
			return BLANK;
	}
}

/** Reads the first visible worksheet of an xlsx workbook; formulas are kept, never evaluated. */
export async function xlsxSheet(bytes: Uint8Array): Promise<SheetRead> {
	const unreadable: SheetRead = {
		ok: false,
		errors: [
			{
				message:
					'The file could not be read as an xlsx workbook (it may be damaged). Open it in a spreadsheet and save it again as .xlsx, or export it as CSV.'
			}
		]
	};
	const expansion = checkZipExpansion(bytes);
	if (!expansion.ok && expansion.problem === 'too-large') {
		const part = expansion.entry ? ` (${expansion.entry} alone goes past it)` : '';
		return {
			ok: false,
			errors: [
				{
					message: `The workbook unpacks to more than ${MAX_EXPANDED_BYTES / 1024 / 1024} MB${part}, far more than a schedule of flows needs. Save a copy holding only the sheet with the flows, or export that sheet as CSV.`
				}
			]
		};
	}
	if (!expansion.ok) return unreadable;
	const workbook = new ExcelJS.Workbook();
	try {
		// A copy with its own ArrayBuffer: the zip reader accepts it, and exceljs's types want one.
		await workbook.xlsx.load(bytes.slice().buffer);
	} catch {
		return unreadable;
	}
	const worksheet = workbook.worksheets.find((sheet) => sheet.state === 'visible');
	if (!worksheet) {
		return { ok: false, errors: [{ message: 'The workbook has no visible worksheet.' }] };
	}
	const rows: SheetRow[] = [];
	worksheet.eachRow({ includeEmpty: false }, (row, rowNumber) => {
		const cells: SheetCell[] = [];
		row.eachCell({ includeEmpty: false }, (cell, columnNumber) => {
			cells[columnNumber - 1] = xlsxCell(cell);
		});
		const dense = Array.from({ length: cells.length }, (_, i) => cells[i] ?? BLANK);
		if (!isBlankRow(dense)) rows.push({ number: rowNumber, cells: dense });
	});
	return { ok: true, sheet: { format: 'xlsx', sheetName: worksheet.name, rows } };
}
