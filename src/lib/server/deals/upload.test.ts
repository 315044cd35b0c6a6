import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import {
	MAX_DATA_ROWS,
	MAX_LISTED_ERRORS,
	MAX_UPLOAD_BYTES,
	inspectUpload,
	readFlows,
	type ColumnMapping,
	type UploadFailure,
	type UploadedFlows,
	type UploadInspection
} from './upload';

// Every file below is built here: CSV as strings, xlsx with exceljs. All data is invented.

const csv = (text: string) => new TextEncoder().encode(text);
const utc = (year: number, month: number, day: number, hour = 0) =>
	new Date(Date.UTC(year, month - 1, day, hour));

async function xlsx(
	rows: ExcelJS.CellValue[][],
	edit?: (sheet: ExcelJS.Worksheet, workbook: ExcelJS.Workbook) => void
): Promise<Uint8Array> {
	const workbook = new ExcelJS.Workbook();
	const sheet = workbook.addWorksheet('Flows');
	for (const row of rows) sheet.addRow(row);
	edit?.(sheet, workbook);
	return new Uint8Array(await workbook.xlsx.writeBuffer());
}

function failed(result: UploadFailure | UploadInspection | UploadedFlows): UploadFailure {
	if (result.ok) throw new Error(`expected a failure, got ${JSON.stringify(result).slice(0, 300)}`);
	return result;
}

function inspected(result: UploadFailure | UploadInspection): UploadInspection {
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result;
}

function flowsOf(result: UploadFailure | UploadedFlows) {
	if (!result.ok) throw new Error(JSON.stringify(result.errors));
	return result.flows;
}

const dated = { mode: 'dated' } as const;
const periodic = { mode: 'periodic' } as const;
const dateAmount = { date: 0, amount: 1 };
const dateAmountLabel = { date: 0, amount: 1, label: 2 };
const issue = (row: number, column: string, fragment: string) => ({
	row,
	column,
	message: expect.stringContaining(fragment)
});

describe('inspectUpload: CSV', () => {
	it('reads a byte-order mark, CRLF line ends, quoted commas, doubled quotes and line breaks', async () => {
		const text =
			'\uFEFFValue date,Amount,Description\r\n' +
			'2026-01-15,"-1,000,000.00","Deposit, ""phase 1"""\r\n' +
			'2026-07-15,250000,"Line one\nline two"\r\n';
		expect(await inspectUpload('lanternfield.csv', csv(text))).toEqual({
			ok: true,
			format: 'csv',
			columns: ['Value date', 'Amount', 'Description'],
			sampleRows: [
				['2026-01-15', '-1,000,000.00', 'Deposit, "phase 1"'],
				['2026-07-15', '250000', 'Line one\nline two']
			],
			rowCount: 2,
			suggested: { date: 0, amount: 1, label: 2 }
		});
	});

	it('detects a semicolon or a tab as the delimiter from the header row', async () => {
		const semicolon = inspected(
			await inspectUpload('orchard.csv', csv('Period;Net cash flow\n0;-500\n1;"600,00"\n'))
		);
		expect(semicolon.columns).toEqual(['Period', 'Net cash flow']);
		expect(semicolon.sampleRows).toEqual([
			['0', '-500'],
			['1', '600,00']
		]);
		expect(semicolon.suggested).toEqual({ period: 0, amount: 1 });
		const tab = inspected(
			await inspectUpload('orchard.tsv', csv('when\tnet\tnote\n2026-01-01\t-5\tfee, paid\n'))
		);
		expect(tab.columns).toEqual(['when', 'net', 'note']);
		expect(tab.sampleRows).toEqual([['2026-01-01', '-5', 'fee, paid']]);
		expect(tab.suggested).toEqual({ date: 0, amount: 1, label: 2 });
	});

	it('reads UTF-16 text saved with its byte-order mark', async () => {
		const text = 'date\tamount\n2026-01-01\t-10\n';
		const bytes = new Uint8Array(2 + text.length * 2);
		bytes.set([0xff, 0xfe]);
		for (let i = 0; i < text.length; i += 1) bytes[2 + 2 * i] = text.charCodeAt(i);
		const result = inspected(await inspectUpload('export.txt', bytes));
		expect(result.columns).toEqual(['date', 'amount']);
		expect(result.sampleRows).toEqual([['2026-01-01', '-10']]);
	});

	it('suggests date and amount columns from their content when the names say nothing', async () => {
		const text = 'A,B,C\nx,2026-01-01,-100\ny,2026-02-01,"1,050.25"\n';
		expect(inspected(await inspectUpload('f.csv', csv(text))).suggested).toEqual({
			date: 1,
			amount: 2
		});
	});

	it('shows the first 20 data rows, counts them all and skips blank rows', async () => {
		const lines = Array.from({ length: 30 }, (_, i) => `${i},${100 + i}\n,\n`);
		const result = inspected(await inspectUpload('f.csv', csv(`period,amount\n${lines.join('')}`)));
		expect(result.rowCount).toBe(30);
		expect(result.sampleRows).toHaveLength(20);
		expect(result.sampleRows[19]).toEqual(['19', '119']);
	});
});

describe('inspectUpload: xlsx', () => {
	it('shows date cells as YYYY-MM-DD and formulas as written, without evaluating them', async () => {
		const bytes = await xlsx([
			['Date', 'Cash flow', 'Item'],
			[utc(2026, 1, 15), -1000, 'Deposit'],
			[utc(2026, 7, 15), { formula: 'B2*-1.1', result: 1100 }, 'Return']
		]);
		expect(await inspectUpload('deal.xlsx', bytes)).toEqual({
			ok: true,
			format: 'xlsx',
			sheetName: 'Flows',
			columns: ['Date', 'Cash flow', 'Item'],
			sampleRows: [
				['2026-01-15', '-1000', 'Deposit'],
				['2026-07-15', '=B2*-1.1', 'Return']
			],
			rowCount: 2,
			suggested: { date: 0, amount: 1, label: 2 }
		});
	});

	it('reads the first visible worksheet and names blank or repeated headers by letter', async () => {
		const bytes = await xlsx([], (_, workbook) => {
			const hidden = workbook.getWorksheet('Flows');
			if (hidden) hidden.state = 'hidden';
			const visible = workbook.addWorksheet('Schedule');
			visible.addRow(['amount', null, 'amount']);
			visible.addRow([-10, 'a', 5]);
		});
		const result = inspected(await inspectUpload('deal.xlsx', bytes));
		expect(result.sheetName).toBe('Schedule');
		expect(result.columns).toEqual(['amount (column A)', 'Column B', 'amount (column C)']);
	});
});

describe('inspectUpload: files it refuses', () => {
	it('refuses an empty file', async () => {
		expect(await inspectUpload('f.csv', new Uint8Array())).toEqual({
			ok: false,
			errors: [{ message: 'The file is empty (0 bytes).' }],
			omitted: 0
		});
	});

	it('refuses a file whose rows are all blank', async () => {
		const result = failed(await inspectUpload('f.csv', csv('\uFEFF\r\n , \r\n')));
		expect(result.errors).toEqual([{ message: 'The file has no content: every row is blank.' }]);
	});

	it('refuses a file over 10 MB before reading it', async () => {
		// A zip signature and junk: had it been parsed, the error would be about a damaged workbook.
		const bytes = new Uint8Array(MAX_UPLOAD_BYTES + 1).fill(0x41);
		bytes.set([0x50, 0x4b, 0x03, 0x04]);
		const result = failed(await inspectUpload('big.xlsx', bytes));
		expect(result.errors).toEqual([
			{ message: 'The file is 10,485,761 bytes; the limit is 10 MB (10,485,760 bytes).' }
		]);
	});

	it('refuses more than 100,000 data rows and accepts exactly 100,000', async () => {
		const over = failed(
			await inspectUpload('f.csv', csv(`amount\n${'1\n'.repeat(MAX_DATA_ROWS + 1)}`))
		);
		expect(over.errors).toEqual([
			{ message: expect.stringContaining('has 100001 data rows; the limit is 100000') }
		]);
		const at = inspected(
			await inspectUpload('f.csv', csv(`amount\n${'1\n'.repeat(MAX_DATA_ROWS)}`))
		);
		expect(at.rowCount).toBe(MAX_DATA_ROWS);
	});

	it('refuses a first row that holds data instead of column names (CSV and xlsx)', async () => {
		const text = failed(await inspectUpload('f.csv', csv('2026-01-15,-1000\n2026-07-15,1100\n')));
		expect(text.errors).toEqual([
			{
				row: 1,
				message: expect.stringContaining('The first row holds data ("2026-01-15", "-1000")')
			}
		]);
		const book = failed(await inspectUpload('f.xlsx', await xlsx([[utc(2026, 1, 15), -1000]])));
		expect(book.errors).toEqual([
			{ row: 1, message: expect.stringContaining('holds data ("2026-01-15", "-1000")') }
		]);
	});

	it('refuses a header row with no data rows under it', async () => {
		const result = failed(await inspectUpload('f.csv', csv('date,amount\n\n')));
		expect(result.errors).toEqual([
			{ row: 1, message: 'The file has a header row but no data rows.' }
		]);
	});

	it('reports a quote that never closes, and text after a closing quote, by row', async () => {
		const open = failed(
			await inspectUpload('f.csv', csv('date,amount\n2026-01-01,1\n2026-02-01,"5\n'))
		);
		expect(open.errors).toEqual([{ row: 3, message: expect.stringContaining('never closes') }]);
		const after = failed(await inspectUpload('f.csv', csv('date,amount\n2026-01-01,"5"x\n')));
		expect(after.errors).toEqual([
			{ row: 2, message: expect.stringContaining('has text after its closing quote ("x")') }
		]);
	});

	it('refuses old .xls, unknown types, and content that contradicts the extension', async () => {
		const ole = new Uint8Array([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1, 0, 0]);
		const cases: Array<[string, Uint8Array, string]> = [
			['old.xls', ole, 'old-style .xls workbook or a password-protected file'],
			['renamed.xlsx', ole, 'old-style .xls workbook'],
			['flows.pdf', csv('amount\n1\n'), 'is not a file Pincer reads'],
			['flows.xlsx', csv('amount\n1\n'), '"flows.xlsx" is named .xlsx but is not an xlsx workbook'],
			['flows.csv', await xlsx([['amount'], [1]]), 'is named .csv but holds an xlsx workbook']
		];
		for (const [name, bytes, fragment] of cases) {
			const result = failed(await inspectUpload(name, bytes));
			expect(result.errors, name).toEqual([{ message: expect.stringContaining(fragment) }]);
		}
	});

	it('refuses a damaged workbook and text that is not UTF-8', async () => {
		const damaged = new Uint8Array(64).fill(0x20);
		damaged.set([0x50, 0x4b, 0x03, 0x04]);
		expect(failed(await inspectUpload('d.xlsx', damaged)).errors).toEqual([
			{ message: expect.stringContaining('could not be read as an xlsx workbook') }
		]);
		const latin1 = new Uint8Array([...csv('label,amount\nCaf'), 0xe9, ...csv(',5\n')]);
		expect(failed(await inspectUpload('l.csv', latin1)).errors).toEqual([
			{ message: expect.stringContaining('not UTF-8 text') }
		]);
	});
});

describe('readFlows: dated CSV', () => {
	it('reads dates and amounts in every accepted form and sorts by date', async () => {
		const text = [
			'date,amount,label',
			'2026-03-01,"(1,250,000.00)",Turbine deposit',
			'2026/12/31,+415000,Energy sales H2',
			'',
			'2026-6-30,"$310,000.50",Energy sales H1',
			'15 Jan 2027,-12.5,Permit renewal',
			'"Mar 1, 2027",0,Holdback',
			'2027-04-01T00:00:00Z,.75,',
			'25/12/2027, \u2212 $3 ,Late fee'
		].join('\n');
		expect(flowsOf(await readFlows('f.csv', csv(text), dateAmountLabel, dated))).toEqual([
			{ date: '2026-03-01', amount: '-1250000.00', label: 'Turbine deposit', row: 2 },
			{ date: '2026-06-30', amount: '310000.50', label: 'Energy sales H1', row: 5 },
			{ date: '2026-12-31', amount: '415000', label: 'Energy sales H2', row: 3 },
			{ date: '2027-01-15', amount: '-12.5', label: 'Permit renewal', row: 6 },
			{ date: '2027-03-01', amount: '0', label: 'Holdback', row: 7 },
			{ date: '2027-04-01', amount: '0.75', row: 8 },
			{ date: '2027-12-25', amount: '-3', label: 'Late fee', row: 9 }
		]);
	});

	it('flips every sign in the borrower convention and keeps zero unsigned', async () => {
		const text = 'date,amount\n2026-01-01,1000.00\n2026-02-01,-250.5\n2026-03-01,0.00\n';
		const result = await readFlows('f.csv', csv(text), dateAmount, {
			mode: 'dated',
			signConvention: 'borrower'
		});
		expect(flowsOf(result).map((flow) => flow.amount)).toEqual(['-1000.00', '250.5', '0.00']);
		const investor = await readFlows('f.csv', csv(text), dateAmount, {
			mode: 'dated',
			signConvention: 'investor'
		});
		expect(flowsOf(investor).map((flow) => flow.amount)).toEqual(['1000.00', '-250.5', '0.00']);
	});

	it('asks for YYYY-MM-DD instead of guessing an ambiguous day and month', async () => {
		const text = 'date,amount\n2026-01-01,-100\n03/04/2026,110\n';
		const result = failed(await readFlows('f.csv', csv(text), dateAmount, dated));
		expect(result.errors).toEqual([
			issue(
				3,
				'date',
				'"03/04/2026" could be 3 April 2026 or 4 March 2026. Write dates as YYYY-MM-DD'
			)
		]);
	});

	it('accepts day-first dates that have one reading, hints at it, and refuses a mixed column', async () => {
		const hinted = failed(
			await readFlows(
				'f.csv',
				csv('date,amount\n25/12/2026,-100\n03/04/2027,50\n'),
				dateAmount,
				dated
			)
		);
		expect(hinted.errors).toEqual([
			issue(3, 'date', 'Row 2 ("25/12/2026") puts the day first, which would make this 2027-04-03.')
		]);
		const mixed = failed(
			await readFlows(
				'f.csv',
				csv('date,amount\n25/12/2026,-100\n12/26/2026,50\n'),
				dateAmount,
				dated
			)
		);
		expect(mixed.errors).toEqual([
			issue(
				3,
				'date',
				'"12/26/2026" puts the month first, but row 2 ("25/12/2026") puts the day first'
			)
		]);
		const fine = await readFlows(
			'f.csv',
			csv('date,amount\n25/12/2026,-100\n31.01.2027,50\n07/07/2027,60\n'),
			dateAmount,
			dated
		);
		expect(flowsOf(fine).map((flow) => flow.date)).toEqual([
			'2026-12-25',
			'2027-01-31',
			'2027-07-07'
		]);
	});

	it('reports every unreadable date with its row and reason', async () => {
		const text = [
			'date,amount',
			'2026-02-30,1',
			'next Tuesday,1',
			'03/04/26,1',
			'46082,1',
			'2026-03-01T09:30,1',
			'2301-01-01,1',
			',5',
			'2026-01-01,1'
		].join('\n');
		const result = failed(await readFlows('f.csv', csv(text), dateAmount, dated));
		expect(result.errors).toEqual([
			issue(2, 'date', '"2026-02-30" is not a calendar date'),
			issue(3, 'date', '"next Tuesday" is not a date Pincer can read. Write dates as YYYY-MM-DD'),
			issue(4, 'date', 'has a two-digit year'),
			issue(5, 'date', '"46082" looks like a spreadsheet day number'),
			issue(6, 'date', 'has a time of day'),
			issue(7, 'date', 'outside the years 1900 to 2200'),
			issue(8, 'date', 'No date; every flow of a dated schedule needs one.')
		]);
	});

	it('reports every unreadable amount with its row and reason', async () => {
		const text = [
			'date,amount',
			'2026-01-01,abc',
			'2026-02-01,"12,34,5"',
			'2026-03-01,1.5E+07',
			'2026-04-01,1234-',
			'2026-05-01,(-100)',
			'2026-06-01,0.1234567890123',
			'2026-07-01,"1.234,56"',
			'2026-08-01,€100',
			'2026-09-01,$100',
			'2026-10-01,1234567890123456789012345'
		].join('\n');
		const result = failed(await readFlows('f.csv', csv(text), dateAmount, dated));
		expect(result.errors).toEqual([
			issue(2, 'amount', '"abc" is not an amount'),
			issue(3, 'amount', '"12,34,5" is not an amount: a comma may only group thousands'),
			issue(4, 'amount', 'is in scientific notation'),
			issue(5, 'amount', 'has its minus sign at the end'),
			issue(6, 'amount', 'has more than one sign or currency mark'),
			issue(7, 'amount', 'has 13 decimal places; amounts may have at most 12'),
			issue(8, 'amount', '"1.234,56" is not an amount: a comma may only group thousands'),
			issue(10, 'amount', 'marked $, but row 9 is marked €; upload one currency at a time'),
			issue(11, 'amount', 'has 25 digits before the decimal point; amounts may have at most 24')
		]);
	});

	it('refuses a comma group without a point in a semicolon file, where it may be a decimal mark', async () => {
		const text = 'date;amount\n2026-01-01;"1,234"\n2026-02-01;"1,234.50"\n2026-03-01;12,5\n';
		const result = failed(await readFlows('f.csv', csv(text), dateAmount, dated));
		expect(result.errors).toEqual([
			issue(2, 'amount', '"1,234" is ambiguous in a semicolon-separated file'),
			issue(4, 'amount', '"12,5" is not an amount')
		]);
		const comma = await readFlows(
			'f.csv',
			csv('date,amount\n2026-01-01,"1,234"\n'),
			dateAmount,
			dated
		);
		expect(flowsOf(comma)[0].amount).toBe('1234');
	});

	it('skips blank rows silently but refuses a row with a label and no amount', async () => {
		const text = 'date,amount,label\n2026-01-01,-100,Deposit\n,,\n\n2026-02-01,,Closing fee\n';
		const result = failed(await readFlows('f.csv', csv(text), dateAmountLabel, dated));
		expect(result.errors).toEqual([
			issue(5, 'amount', 'No amount, but the row is not blank (it holds "Closing fee")')
		]);
	});

	it('refuses a header row repeated inside the data', async () => {
		const text = 'date,amount\n2026-01-01,-100\nDate, Amount \n2026-02-01,110\n';
		const result = failed(await readFlows('f.csv', csv(text), dateAmount, dated));
		expect(result.errors).toEqual([
			{ row: 3, message: expect.stringContaining('This row repeats the header row') }
		]);
	});

	it('numbers rows as a spreadsheet shows them when quoted fields hold line breaks', async () => {
		const text = 'date,amount,label\n2026-01-01,-100,"two\nlines"\n2026-02-01,abc,x\n';
		const result = failed(await readFlows('f.csv', csv(text), dateAmountLabel, dated));
		expect(result.errors).toEqual([issue(3, 'amount', '"abc" is not an amount')]);
	});

	it('lists the first 200 problems and counts the rest', async () => {
		const rows = Array.from({ length: 250 }, (_, i) => `2026-01-01,bad${i}`);
		const result = failed(
			await readFlows('f.csv', csv(`date,amount\n${rows.join('\n')}`), dateAmount, dated)
		);
		expect(result.omitted).toBe(50);
		expect(result.errors).toHaveLength(MAX_LISTED_ERRORS + 1);
		expect(result.errors[0]).toEqual(issue(2, 'amount', '"bad0"'));
		expect(result.errors[199]).toEqual(issue(201, 'amount', '"bad199"'));
		expect(result.errors[200]).toEqual({
			message: expect.stringContaining('…and 50 more problems not listed')
		});
	});
});

describe('readFlows: column mapping', () => {
	const text = 'date,amount,label\n2026-01-01,-100,x\n';

	it('needs a date column in dated mode', async () => {
		const result = failed(await readFlows('f.csv', csv(text), { amount: 1 }, dated));
		expect(result.errors).toEqual([
			{ message: expect.stringContaining('Dated flows need a date column') }
		]);
	});

	it('needs an amount column that exists, and one column per role', async () => {
		const missing = failed(
			await readFlows('f.csv', csv(text), { date: 0 } as unknown as ColumnMapping, dated)
		);
		expect(missing.errors).toEqual([{ message: 'Choose the column that holds the amounts.' }]);
		const outside = failed(await readFlows('f.csv', csv(text), { date: 0, amount: 5 }, dated));
		expect(outside.errors).toEqual([
			{ message: "The amount column is set to 5, but the file's columns are numbered 0 to 2." }
		]);
		const shared = failed(await readFlows('f.csv', csv(text), { date: 0, amount: 0 }, dated));
		expect(shared.errors).toEqual([
			{
				column: 'date',
				message: 'The date and amount columns are both set to "date"; each needs its own column.'
			}
		]);
	});
});

describe('readFlows: periodic', () => {
	it('reads a period column and sorts by period', async () => {
		const text = 'period,amount\n2,300\n0,-1000\n1,400\n';
		expect(
			flowsOf(await readFlows('f.csv', csv(text), { period: 0, amount: 1 }, periodic))
		).toEqual([
			{ period: 0, amount: '-1000', row: 3 },
			{ period: 1, amount: '400', row: 4 },
			{ period: 2, amount: '300', row: 2 }
		]);
	});

	it('numbers the periods by row order, from 0, when no period column is chosen', async () => {
		const text = 'amount\n-1000\n\n300\n400\n';
		expect(flowsOf(await readFlows('f.csv', csv(text), { amount: 0 }, periodic))).toEqual([
			{ period: 0, amount: '-1000', row: 2 },
			{ period: 1, amount: '300', row: 4 },
			{ period: 2, amount: '400', row: 5 }
		]);
	});

	it('refuses periods that are not whole numbers from 0', async () => {
		const text = 'period,amount\n2.5,1\n-1,1\nx,1\n,1\n100001,1\n';
		const result = failed(await readFlows('f.csv', csv(text), { period: 0, amount: 1 }, periodic));
		expect(result.errors).toEqual([
			issue(2, 'period', '"2.5" has a decimal point'),
			issue(3, 'period', 'Periods start at 0; -1 is negative.'),
			issue(4, 'period', '"x" is not a period number'),
			issue(5, 'period', 'No period number'),
			issue(6, 'period', 'beyond the last period allowed, 100000')
		]);
		const book = await xlsx([
			['period', 'amount'],
			[1.5, 1]
		]);
		expect(
			failed(await readFlows('f.xlsx', book, { period: 0, amount: 1 }, periodic)).errors
		).toEqual([issue(2, 'period', '"1.5" is not a whole number of periods.')]);
	});
});

describe('readFlows: xlsx', () => {
	it('refuses formula cells, asking for values, and never uses their cached results', async () => {
		const bytes = await xlsx([
			['date', 'amount', 'label'],
			[utc(2026, 1, 1), -1000, 'Deposit'],
			[utc(2027, 1, 1), { formula: 'B2*-1.1', result: 1100 }, 'Return'],
			[utc(2028, 1, 1), 5, { formula: 'C3&" again"', result: 'Return again' }]
		]);
		const result = failed(await readFlows('f.xlsx', bytes, dateAmountLabel, dated));
		expect(result.errors).toEqual([
			issue(3, 'amount', 'holds a formula (=B2*-1.1), not a value'),
			issue(4, 'label', 'holds a formula (=C3&" again")')
		]);
		expect(result.errors[0].message).toContain('paste it back as values only');
	});

	it('turns numbers into their shortest exact decimal strings', async () => {
		const bytes = await xlsx([
			['date', 'amount'],
			...[0.1, 1e-7, -0, 1234.56, 1e21, -33.61].map((amount, i) => [utc(2026, 1, i + 1), amount])
		]);
		expect(
			flowsOf(await readFlows('f.xlsx', bytes, dateAmount, dated)).map((f) => f.amount)
		).toEqual(['0.1', '0.0000001', '0', '1234.56', '1000000000000000000000', '-33.61']);
	});

	it('refuses a stored double with more than 12 decimal places instead of rounding it', async () => {
		const bytes = await xlsx([
			['date', 'amount'],
			[utc(2026, 1, 1), 0.1 + 0.2]
		]);
		expect(failed(await readFlows('f.xlsx', bytes, dateAmount, dated)).errors).toEqual([
			issue(
				2,
				'amount',
				'The number 0.30000000000000004 (as the workbook stores it) has 17 decimal places'
			)
		]);
	});

	it('reads date cells as UTC calendar days and refuses what is not a plain day', async () => {
		const bytes = await xlsx(
			[
				['date', 'amount'],
				[utc(2026, 3, 1), 1],
				['2026-03-02', 2],
				[utc(2026, 3, 3, 12), 3],
				[46082, 4],
				[utc(1900, 2, 1), 5],
				[utc(2026, 3, 6), true],
				[utc(2026, 3, 7), { error: '#DIV/0!' }],
				[utc(2026, 3, 8), 8],
				[utc(2026, 3, 9), null]
			],
			(sheet) => sheet.mergeCells('B9:B10')
		);
		const result = failed(await readFlows('f.xlsx', bytes, dateAmount, dated));
		expect(result.errors).toEqual([
			issue(4, 'date', 'holds a date with a time of day (2026-03-03 12:00:00)'),
			issue(5, 'date', 'holds the number 46082, not a date'),
			issue(6, 'date', 'before 1900-03-01 are off by one day'),
			issue(7, 'amount', 'holds "TRUE", not an amount'),
			issue(8, 'amount', 'holds the spreadsheet error #DIV/0!'),
			issue(10, 'amount', 'part of cells merged into B9')
		]);
	});

	it('keeps the spreadsheet row numbers across blank rows', async () => {
		const bytes = await xlsx([
			['date', 'amount'],
			[utc(2026, 1, 1), -5],
			[],
			['', null],
			[utc(2026, 2, 1), 'ten']
		]);
		expect(failed(await readFlows('f.xlsx', bytes, dateAmount, dated)).errors).toEqual([
			issue(5, 'amount', '"ten" is not an amount')
		]);
	});

	it('round-trips 10,000 dated rows exactly', async () => {
		const expected = Array.from({ length: 10_000 }, (_, i) => {
			const cents = ((i * 7919) % 2_000_003) - 1_000_000;
			const amount = (cents / 100).toFixed(2).replace(/\.?0+$/, '');
			const date = new Date(Date.UTC(2026, 0, 1) + i * 86_400_000).toISOString().slice(0, 10);
			return { date, amount: amount === '-0' ? '0' : amount, label: `Flow ${i}`, row: i + 2 };
		});
		const bytes = await xlsx([
			['Date', 'Amount', 'Label'],
			...expected.map((flow) => [
				new Date(`${flow.date}T00:00:00Z`),
				Number(flow.amount),
				flow.label
			])
		]);
		const result = flowsOf(await readFlows('big.xlsx', bytes, dateAmountLabel, dated));
		expect(result).toHaveLength(10_000);
		expect(result).toEqual(expected);
	});
});
