import type { ScheduleRow } from '../../schemas/loan';
import { inspectUpload, readFlows, type UploadFailure } from '../deals/upload';

/**
 * A loan schedule from a CSV or xlsx file with a date column and an amount column (the columns
 * are found from their headers): money lent is negative (an advance), money repaid positive (a
 * payment), as seen from the lender. Every bad row is reported with its row number.
 */
export async function scheduleFromFile(
	fileName: string,
	bytes: Uint8Array
): Promise<{ ok: true; rows: ScheduleRow[] } | { ok: false; problems: string[] }> {
	const inspected = await inspectUpload(fileName, bytes);
	if (!inspected.ok) return { ok: false, problems: messages(inspected) };
	// Suggestions look at the values; fall back on the headers when a bad row hides the column.
	const byHeader = (pattern: RegExp) => {
		const index = inspected.columns.findIndex((c) => pattern.test(c));
		return index >= 0 ? index : undefined;
	};
	const date = inspected.suggested.date ?? byHeader(/date|due|when/i);
	const amount = inspected.suggested.amount ?? byHeader(/amount|payment|flow|sum/i);
	if (date === undefined || amount === undefined) {
		return {
			ok: false,
			problems: [
				'The file needs a date column and an amount column (headers such as "Date" and "Amount").'
			]
		};
	}
	const read = await readFlows(fileName, bytes, { date, amount }, { mode: 'dated' });
	if (!read.ok) return { ok: false, problems: messages(read) };
	const rows: ScheduleRow[] = [];
	for (const flow of read.flows) {
		if (/^[+-]?0*(\.0*)?$/.test(flow.amount)) continue;
		const negative = flow.amount.startsWith('-');
		rows.push({
			kind: negative ? 'advance' : 'payment',
			date: flow.date!,
			amount: flow.amount.replace(/^[+-]/, '')
		});
	}
	if (!rows.some((r) => r.kind === 'advance')) {
		return {
			ok: false,
			problems: ['No advance found: enter the money lent as a negative amount (the lender’s view).']
		};
	}
	return { ok: true, rows };
}

function messages(failure: UploadFailure): string[] {
	return failure.errors.map(
		(e) => `${e.row ? `Row ${e.row}${e.column ? `, column ${e.column}` : ''}: ` : ''}${e.message}`
	);
}
