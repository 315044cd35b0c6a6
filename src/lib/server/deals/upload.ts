/*
 * Cash flows from an uploaded CSV or xlsx file, in two steps: inspectUpload shows the columns
 * and suggests which holds what; readFlows reads every row under a chosen mapping and either
 * returns all flows or reports every bad row (spreadsheet row number, column name, reason).
 *
 * Decisions:
 * - The format comes from the content (a zip is xlsx, anything else is text); the extension
 *   must agree (.xlsx, or .csv/.tsv/.txt). Old .xls and password-protected files are refused.
 * - xlsx: the first visible worksheet. CSV: UTF-8 (or UTF-16 with its mark), delimiter found
 *   in the header line. Row numbers are those a spreadsheet shows, counting blank rows.
 * - The header is the first non-blank row; it is refused if any cell looks like a date or a
 *   number. Blank rows are skipped; a row repeating the header is an error.
 * - Periodic mode without a period column: periods follow row order from 0. With one: whole
 *   numbers 0 to 100000; repeats and gaps are kept (the caller decides how to combine them).
 * - Dated mode reads only the date column, periodic mode only the period column.
 * - Amount text: comma thousands groups, point decimal mark, leading + or −, parentheses for
 *   negatives, one currency symbol stripped (one currency per file). See upload-values.ts.
 */

import { cellText, type SheetCell, type SheetRow, type UploadError } from './upload-sheet';
import { SAMPLE_ROW_COUNT, failure, loadUpload, type UploadFailure } from './upload-file';
import { dateOrderEvidence, flowDate } from './upload-dates';
import { suggestColumns, type ColumnRole } from './upload-suggest';
import { readAmount, readLabel, readPeriod, type Reading } from './upload-values';

export type { UploadError } from './upload-sheet';
export type { UploadFailure } from './upload-file';
export type { ColumnRole } from './upload-suggest';
export { MAX_DATA_ROWS, MAX_LISTED_ERRORS, MAX_UPLOAD_BYTES } from './upload-file';

const BLANK: SheetCell = { kind: 'blank' };

/** Zero-based column indexes, in the order of `columns`. */
export interface ColumnMapping {
	date?: number;
	period?: number;
	amount: number;
	label?: number;
}

export interface ReadOptions {
	mode: 'dated' | 'periodic';
	/** investor (default): money out is negative, signs kept. borrower: every sign flipped. */
	signConvention?: 'investor' | 'borrower';
}

export interface UploadInspection {
	ok: true;
	format: 'csv' | 'xlsx';
	/** The worksheet read, for xlsx files. */
	sheetName?: string;
	columns: string[];
	sampleRows: string[][];
	/** Non-blank rows below the header. */
	rowCount: number;
	suggested: Partial<Record<ColumnRole, number>>;
}

export interface UploadedFlow {
	date?: string;
	period?: number;
	/** Exact decimal string, negative for money out (after the sign convention). */
	amount: string;
	label?: string;
	/** Spreadsheet row the flow came from (header = row 1 when it is the first row). */
	row: number;
}

/** Columns, the first rows and suggested column roles of an uploaded CSV or xlsx file. */
export async function inspectUpload(
	fileName: string,
	bytes: Uint8Array
): Promise<UploadInspection | UploadFailure> {
	const loaded = await loadUpload(fileName, bytes);
	if ('ok' in loaded) return loaded;
	const width = loaded.columns.length;
	return {
		ok: true,
		format: loaded.sheet.format,
		...(loaded.sheet.sheetName !== undefined ? { sheetName: loaded.sheet.sheetName } : {}),
		columns: loaded.columns,
		sampleRows: loaded.data
			.slice(0, SAMPLE_ROW_COUNT)
			.map((row) => Array.from({ length: width }, (_, i) => cellText(row.cells[i] ?? BLANK))),
		rowCount: loaded.data.length,
		suggested: suggestColumns(loaded)
	};
}

// ---- reading the flows ----

export interface UploadedFlows {
	ok: true;
	/** Sorted by date (dated mode) or period (periodic mode), then by row. */
	flows: UploadedFlow[];
}

function mappingErrors(mapping: ColumnMapping, options: ReadOptions, columns: string[]) {
	const errors: UploadError[] = [];
	if (mapping.amount === undefined) {
		errors.push({ message: 'Choose the column that holds the amounts.' });
	}
	if (options.mode === 'dated' && mapping.date === undefined) {
		errors.push({
			message:
				'Dated flows need a date column: choose the column that holds the dates, or read the file as periodic flows.'
		});
	}
	const roles: ColumnRole[] =
		options.mode === 'dated' ? ['date', 'amount', 'label'] : ['period', 'amount', 'label'];
	const used = new Map<number, ColumnRole>();
	for (const role of roles) {
		const index = mapping[role];
		if (index === undefined) continue;
		if (!Number.isInteger(index) || index < 0 || index >= columns.length) {
			errors.push({
				message: `The ${role} column is set to ${index}, but the file's columns are numbered 0 to ${columns.length - 1}.`
			});
			continue;
		}
		const other = used.get(index);
		if (other) {
			errors.push({
				column: columns[index],
				message: `The ${other} and ${role} columns are both set to "${columns[index]}"; each needs its own column.`
			});
		} else used.set(index, role);
	}
	return errors;
}

/** A row's shown texts, case-folded, without trailing blanks: equal keys mean equal rows. */
function rowKey(row: SheetRow): string {
	const texts = row.cells.map((cell) => cellText(cell).toLowerCase());
	while (texts.length > 0 && texts[texts.length - 1] === '') texts.pop();
	return JSON.stringify(texts);
}

function negate(amount: string): string {
	if (amount.startsWith('-')) return amount.slice(1);
	return /^[0.]+$/.test(amount) ? amount : `-${amount}`;
}

interface RowContext {
	columns: string[];
	mapping: ColumnMapping;
	options: ReadOptions;
	semicolonFile: boolean;
	/** The first currency symbol seen and its row; later rows must match it. */
	currency?: { symbol: string; row: number };
}

/** The row's amount in the chosen sign convention, or undefined after reporting why not. */
function rowAmount(row: SheetRow, context: RowContext, report: Report): string | undefined {
	const { mapping } = context;
	const cell = row.cells[mapping.amount] ?? BLANK;
	if (cell.kind === 'blank') {
		const label = mapping.label === undefined ? BLANK : (row.cells[mapping.label] ?? BLANK);
		const shown = label.kind === 'blank' ? row.cells.find((c) => c.kind !== 'blank') : label;
		report(
			mapping.amount,
			`No amount, but the row is not blank (it holds ${JSON.stringify(cellText(shown ?? BLANK))}). Enter the amount or delete the row.`
		);
		return undefined;
	}
	const reading = readAmount(cell, context.semicolonFile);
	if (!reading.ok) {
		report(mapping.amount, reading.message);
		return undefined;
	}
	const { amount, currency } = reading.value;
	if (currency && context.currency && currency !== context.currency.symbol) {
		report(
			mapping.amount,
			`This amount is marked ${currency}, but row ${context.currency.row} is marked ${context.currency.symbol}; upload one currency at a time.`
		);
		return undefined;
	}
	if (currency && !context.currency) context.currency = { symbol: currency, row: row.number };
	return context.options.signConvention === 'borrower' ? negate(amount) : amount;
}

type Report = (column: number, message: string) => void;

function cellReading<T>(
	cell: SheetCell,
	whenBlank: string,
	read: (cell: SheetCell) => Reading<T>
): Reading<T> {
	return cell.kind === 'blank' ? { ok: false, message: whenBlank } : read(cell);
}

const compareText = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

/**
 * Every flow of an uploaded file under a column mapping, amounts as exact decimal strings in
 * the investor convention (money out negative), or every problem found, row by row.
 */
export async function readFlows(
	fileName: string,
	bytes: Uint8Array,
	mapping: ColumnMapping,
	options: ReadOptions
): Promise<UploadedFlows | UploadFailure> {
	const loaded = await loadUpload(fileName, bytes);
	if ('ok' in loaded) return loaded;
	const { columns, header, data, sheet } = loaded;
	const problems = mappingErrors(mapping, options, columns);
	if (problems.length > 0) return failure(problems);
	const dateColumn = options.mode === 'dated' ? mapping.date : undefined;
	const periodColumn = options.mode === 'periodic' ? mapping.period : undefined;
	const evidence = dateColumn === undefined ? {} : dateOrderEvidence(data, dateColumn);
	const context: RowContext = { columns, mapping, options, semicolonFile: sheet.delimiter === ';' };
	const headerKey = rowKey(header);
	const errors: UploadError[] = [];
	const flows: UploadedFlow[] = [];
	data.forEach((row, position) => {
		if (rowKey(row) === headerKey) {
			errors.push({
				row: row.number,
				message:
					'This row repeats the header row; delete it (files pasted together often keep a second header).'
			});
			return;
		}
		const before = errors.length;
		const report: Report = (column, message) =>
			errors.push({ row: row.number, column: columns[column], message });
		const cell = (column: number) => row.cells[column] ?? BLANK;
		const amount = rowAmount(row, context, report);
		const time: Pick<UploadedFlow, 'date' | 'period'> = {};
		let label: string | undefined;
		if (dateColumn !== undefined) {
			const found = cellReading(
				cell(dateColumn),
				'No date; every flow of a dated schedule needs one.',
				(c) => flowDate(c, evidence)
			);
			if (found.ok) time.date = found.value;
			else report(dateColumn, found.message);
		} else if (periodColumn !== undefined) {
			const found = cellReading(
				cell(periodColumn),
				'No period number; every flow needs one.',
				readPeriod
			);
			if (found.ok) time.period = found.value;
			else report(periodColumn, found.message);
		} else time.period = position; // row order, from 0, among the non-blank data rows
		if (mapping.label !== undefined) {
			const found = readLabel(cell(mapping.label));
			if (!found.ok) report(mapping.label, found.message);
			else label = found.value;
		}
		if (errors.length === before && amount !== undefined) {
			flows.push({ ...time, amount, ...(label === undefined ? {} : { label }), row: row.number });
		}
	});
	if (errors.length > 0) return failure(errors);
	flows.sort((a, b) =>
		dateColumn !== undefined
			? compareText(a.date ?? '', b.date ?? '')
			: (a.period ?? 0) - (b.period ?? 0)
	);
	return { ok: true, flows };
}
