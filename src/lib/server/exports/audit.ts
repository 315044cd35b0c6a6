import ExcelJS from 'exceljs';
import type { allAuditEvents } from '../audit';

type Rows = Awaited<ReturnType<typeof allAuditEvents>>;

const header = [
	'id',
	'time_utc',
	'actor_email',
	'actor_name',
	'action',
	'subject',
	'payload_json',
	'hash'
];

function cells(row: Rows[number]) {
	return [
		row.id,
		row.createdAt.toISOString(),
		row.actorEmail ?? '',
		row.actorName ?? '',
		row.action,
		row.subject ?? '',
		JSON.stringify(row.payload),
		row.hash ?? ''
	];
}

/** RFC 4180 CSV; cells that a spreadsheet would run as a formula are prefixed with a quote. */
export function auditCsv(rows: Rows): string {
	const quote = (value: string | number) => {
		let text = String(value);
		if (/^[=+\-@\t\r]/.test(text)) text = `'${text}`;
		return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
	};
	return (
		[header, ...rows.map(cells)].map((line) => line.map(quote).join(',')).join('\r\n') + '\r\n'
	);
}

export async function auditXlsx(rows: Rows, title: string): Promise<Uint8Array> {
	const book = new ExcelJS.Workbook();
	book.creator = 'Pincer';
	book.title = title;
	const sheet = book.addWorksheet('Audit trail', { views: [{ state: 'frozen', ySplit: 1 }] });
	sheet.columns = header.map((key) => ({
		header: key,
		key,
		width: key === 'payload_json' ? 60 : 22
	}));
	sheet.getRow(1).font = { bold: true };
	for (const row of rows) sheet.addRow(cells(row));
	return new Uint8Array(await book.xlsx.writeBuffer());
}
