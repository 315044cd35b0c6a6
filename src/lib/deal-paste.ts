// Rows pasted from a spreadsheet into a deal: one flow per line, cells separated by tabs (or ; or ,):
// date or period, amount, optional label. Shared by the browser editor and the server.
import type { DealFlow } from './schemas/deal';

export function parsePastedFlows(
	text: string,
	mode: 'dated' | 'periodic'
): { ok: true; flows: DealFlow[] } | { ok: false; line: number; message: string } {
	const flows: DealFlow[] = [];
	for (const [index, raw] of text.split(/\r?\n/).entries()) {
		if (!raw.trim()) continue;
		const separator = raw.includes('\t') ? '\t' : raw.includes(';') ? ';' : ',';
		const [when = '', rawAmount = '', label] = raw.split(separator).map((c) => c.trim());
		const amount = rawAmount
			.replace(/[\s,$€£]/g, '')
			.replace(/^\((.*)\)$/, '-$1')
			.replace('−', '-');
		const isWhen = mode === 'dated' ? /^\d{4}-\d{2}-\d{2}$/.test(when) : /^\d{1,6}$/.test(when);
		const isAmount = /^[+-]?\d{1,24}(\.\d{1,12})?$/.test(amount);
		if (flows.length === 0 && !isWhen && !isAmount) continue; // a header line
		if (!isWhen) {
			return {
				ok: false,
				line: index + 1,
				message: `Line ${index + 1}: "${when}" is not ${mode === 'dated' ? 'a date written 2026-03-15' : 'a period number (0, 1, 2, …)'}.`
			};
		}
		if (!isAmount)
			return {
				ok: false,
				line: index + 1,
				message: `Line ${index + 1}: "${rawAmount}" is not an amount such as -1000 or 250.50.`
			};
		flows.push(
			mode === 'dated'
				? { date: when, amount, label: label || undefined }
				: { period: Number(when), amount, label: label || undefined }
		);
	}
	return { ok: true, flows };
}
