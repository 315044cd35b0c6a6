/*
 * Opening an upload: size and format checks, the sheet read, the header row, the row limit and
 * the column names. Shared by inspectUpload and readFlows.
 */

import {
	cellText,
	columnLetter,
	csvSheet,
	xlsxSheet,
	type Sheet,
	type SheetCell,
	type SheetRead,
	type SheetRow,
	type UploadError
} from './upload-sheet';
import { readDate } from './upload-dates';
import { readAmount } from './upload-values';

export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;
export const MAX_DATA_ROWS = 100_000;
/** Errors listed in one answer; the rest are counted in `omitted`. */
export const MAX_LISTED_ERRORS = 200;
export const SAMPLE_ROW_COUNT = 20;

export interface UploadFailure {
	ok: false;
	errors: UploadError[];
	/** Problems found beyond the first MAX_LISTED_ERRORS (also said in a last, row-less error). */
	omitted: number;
}

export interface Loaded {
	sheet: Sheet;
	header: SheetRow;
	data: SheetRow[];
	columns: string[];
}

const BLANK: SheetCell = { kind: 'blank' };
const ZIP = [0x50, 0x4b, 0x03, 0x04];
const OLE = [0xd0, 0xcf, 0x11, 0xe0];
const TEXT_EXTENSIONS = ['csv', 'tsv', 'txt'];

/** A failed answer listing at most MAX_LISTED_ERRORS problems and counting the rest. */
export function failure(errors: UploadError[]): UploadFailure {
	if (errors.length <= MAX_LISTED_ERRORS) return { ok: false, errors, omitted: 0 };
	const omitted = errors.length - MAX_LISTED_ERRORS;
	const listed = errors.slice(0, MAX_LISTED_ERRORS);
	listed.push({
		message: `…and ${omitted} more problems not listed. Fix the ones above and upload again to see the rest.`
	});
	return { ok: false, errors: listed, omitted };
}

async function readSheet(fileName: string, bytes: Uint8Array): Promise<SheetRead> {
	const fail = (message: string): SheetRead => ({ ok: false, errors: [{ message }] });
	if (bytes.byteLength === 0) return fail('The file is empty (0 bytes).');
	if (bytes.byteLength > MAX_UPLOAD_BYTES) {
		const count = (n: number) => n.toLocaleString('en-US');
		return fail(
			`The file is ${count(bytes.byteLength)} bytes; the limit is 10 MB (${count(MAX_UPLOAD_BYTES)} bytes).`
		);
	}
	const starts = (signature: number[]) => signature.every((byte, i) => bytes[i] === byte);
	const extension = /\.([a-z0-9]+)$/i.exec(fileName.trim())?.[1].toLowerCase() ?? '';
	if (starts(OLE) || extension === 'xls') {
		return fail(
			'This is an old-style .xls workbook or a password-protected file. Save it as .xlsx (without a password) or as CSV UTF-8.'
		);
	}
	if (extension === 'xlsx') {
		if (!starts(ZIP)) return fail(`"${fileName}" is named .xlsx but is not an xlsx workbook.`);
		return xlsxSheet(bytes);
	}
	if (TEXT_EXTENSIONS.includes(extension)) {
		if (starts(ZIP)) {
			return fail(
				`"${fileName}" is named .${extension} but holds an xlsx workbook; rename it .xlsx.`
			);
		}
		return csvSheet(bytes);
	}
	return fail(
		`"${fileName}" is not a file Pincer reads; upload a .csv (.tsv, .txt) or .xlsx file.`
	);
}

function looksLikeData(cell: SheetCell): boolean {
	if (cell.kind === 'number' || cell.kind === 'date') return true;
	if (cell.kind !== 'text') return false;
	const date = readDate(cell);
	return date.ok || 'ambiguous' in date || readAmount(cell, false).ok;
}

function columnNames(header: SheetRow, width: number): string[] {
	const raw = Array.from({ length: width }, (_, i) => cellText(header.cells[i] ?? BLANK));
	const seen = (name: string) => raw.filter((other) => other.toLowerCase() === name.toLowerCase());
	return raw.map((name, i) => {
		if (name === '') return `Column ${columnLetter(i)}`;
		return seen(name).length > 1 ? `${name} (column ${columnLetter(i)})` : name;
	});
}

/** The sheet of an upload with its header, data rows (non-blank) and column names, or why not. */
export async function loadUpload(
	fileName: string,
	bytes: Uint8Array
): Promise<Loaded | UploadFailure> {
	const read = await readSheet(fileName, bytes);
	if (!read.ok) return failure(read.errors);
	const { sheet } = read;
	const [header, ...data] = sheet.rows;
	if (!header) return failure([{ message: 'The file has no content: every row is blank.' }]);
	const dataCells = header.cells.filter((cell) => cell.kind !== 'blank' && looksLikeData(cell));
	if (dataCells.length > 0) {
		const shown = dataCells.slice(0, 3).map((cell) => JSON.stringify(cellText(cell)));
		return failure([
			{
				row: header.number,
				message: `The first row holds data (${shown.join(', ')}), not column names. Add a header row naming the columns, for example: date, amount, label.`
			}
		]);
	}
	if (data.length === 0) {
		return failure([
			{ row: header.number, message: 'The file has a header row but no data rows.' }
		]);
	}
	if (data.length > MAX_DATA_ROWS) {
		return failure([
			{
				message: `The file has ${data.length} data rows; the limit is ${MAX_DATA_ROWS}. Split it into smaller files.`
			}
		]);
	}
	const lastFilled = (row: SheetRow) =>
		row.cells.findLastIndex((cell) => cell.kind !== 'blank') + 1;
	const width = sheet.rows.reduce((widest, row) => Math.max(widest, lastFilled(row)), 0);
	return { sheet, header, data, columns: columnNames(header, width) };
}
