/*
 * Text files of cash flows: decoding and a small CSV reader. Quoted fields may hold delimiters,
 * line breaks and doubled quotes; lines end in LF, CRLF or CR. The delimiter (comma, semicolon
 * or tab) is the one that occurs most often, outside quotes, in the first non-blank line.
 */

import type { UploadError } from './upload-sheet';

export type CsvDelimiter = ',' | ';' | '\t';

export type DecodedText = { ok: true; text: string } | { ok: false; errors: UploadError[] };

export type CsvRecords =
	{ ok: true; delimiter: CsvDelimiter; records: string[][] } | { ok: false; errors: UploadError[] };

/** UTF-8 (a byte-order mark is dropped) or, when it starts with its mark, UTF-16 text. */
export function decodeText(bytes: Uint8Array): DecodedText {
	let encoding = 'utf-8';
	if (bytes[0] === 0xff && bytes[1] === 0xfe) encoding = 'utf-16le';
	else if (bytes[0] === 0xfe && bytes[1] === 0xff) encoding = 'utf-16be';
	let text: string;
	try {
		text = new TextDecoder(encoding, { fatal: true }).decode(bytes);
	} catch {
		return {
			ok: false,
			errors: [
				{
					message:
						'The file is not UTF-8 text. Save it from the spreadsheet as "CSV UTF-8" and upload it again.'
				}
			]
		};
	}
	if (text.includes('\u0000')) {
		return {
			ok: false,
			errors: [
				{ message: 'The file holds binary data, not CSV text. Upload a .csv or .xlsx file.' }
			]
		};
	}
	return { ok: true, text };
}

/** The delimiter used most often outside quotes in the first non-blank line (comma on a tie). */
export function detectDelimiter(text: string): CsvDelimiter {
	const counts: Record<CsvDelimiter, number> = { ',': 0, ';': 0, '\t': 0 };
	let inQuotes = false;
	let seenContent = false;
	for (let i = 0; i < text.length; i += 1) {
		const ch = text[i];
		if (ch === '"') inQuotes = !inQuotes;
		else if (inQuotes) continue;
		else if (ch === '\n' || ch === '\r') {
			if (seenContent) break;
			counts[','] = counts[';'] = counts['\t'] = 0;
		} else if (ch === ',' || ch === ';' || ch === '\t') counts[ch] += 1;
		if (ch.trim() !== '') seenContent = true;
	}
	const ranked = (['\t', ';', ','] as const).filter((d) => counts[d] > 0);
	ranked.sort((a, b) => counts[b] - counts[a]);
	return ranked[0] ?? ',';
}

function isLineEnd(ch: string | undefined): boolean {
	return ch === '\n' || ch === '\r';
}

/**
 * Splits text into records of fields. Record k (from 1) is row k as a spreadsheet shows it,
 * however many line breaks its quoted fields hold.
 */
export function parseCsv(text: string, delimiter: CsvDelimiter): CsvRecords {
	const records: string[][] = [];
	const errors: UploadError[] = [];
	const n = text.length;
	let i = 0;
	while (i < n) {
		const row = records.length + 1;
		const fields: string[] = [];
		for (;;) {
			let value: string;
			if (text[i] === '"') {
				let j = i + 1;
				value = '';
				for (;;) {
					const quote = text.indexOf('"', j);
					if (quote < 0) {
						errors.push({
							row,
							message: `A quoted field in column ${fields.length + 1} opens here and never closes; look for a stray double quote (") in this row.`
						});
						return { ok: false, errors };
					}
					value += text.slice(j, quote);
					if (text[quote + 1] === '"') {
						value += '"';
						j = quote + 2;
						continue;
					}
					i = quote + 1;
					break;
				}
				let k = i;
				while (k < n && (text[k] === ' ' || (text[k] === '\t' && delimiter !== '\t'))) k += 1;
				if (k < n && text[k] !== delimiter && !isLineEnd(text[k])) {
					let end = k;
					while (end < n && text[end] !== delimiter && !isLineEnd(text[end])) end += 1;
					errors.push({
						row,
						message: `Column ${fields.length + 1} has text after its closing quote (${JSON.stringify(text.slice(k, Math.min(end, k + 20)))}); a quote inside a quoted field must be doubled ("").`
					});
					k = end;
				}
				i = k;
			} else {
				let end = i;
				while (end < n && text[end] !== delimiter && !isLineEnd(text[end])) end += 1;
				value = text.slice(i, end);
				i = end;
			}
			fields.push(value);
			if (i < n && text[i] === delimiter) {
				i += 1;
				continue;
			}
			if (text[i] === '\r') i += 1;
			if (text[i] === '\n') i += 1;
			break;
		}
		records.push(fields);
	}
	return errors.length > 0 ? { ok: false, errors } : { ok: true, delimiter, records };
}
