// Between the loan forms (superforms + zod) and a LoanFile. Shared by the new-loan page and the
// loan page's edit forms.
import { fail } from '@sveltejs/kit';
import { setError, superValidate, type SuperValidated } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import {
	loanTermsSchema,
	parsePastedRows,
	scheduleEntrySchema,
	type LoanTerms,
	type ScheduleEntry,
	type ScheduleRow
} from '$lib/schemas/loan';
import type { LoanFile } from './file';
import type { SaveOutcome } from './index';

export const termsAdapter = zod4(loanTermsSchema);
export const entryAdapter = zod4(scheduleEntrySchema);

/** Drops fee rows left blank. */
export function normaliseTerms(terms: LoanTerms): LoanTerms {
	const keep = terms.feeAmount.map((amount, i) => !!(amount || terms.feeName[i]));
	return {
		...terms,
		balloon: terms.balloon || '',
		feeName: terms.feeName.filter((_, i) => keep[i]),
		feeAmount: terms.feeAmount.filter((_, i) => keep[i]),
		feeKind: terms.feeKind.filter((_, i) => keep[i])
	};
}

export function entryRows(entry: ScheduleEntry): { rows: ScheduleRow[] } | { message: string } {
	const rows: ScheduleRow[] = [];
	entry.rowDate.forEach((date, i) => {
		const amount = entry.rowAmount[i];
		if (date || amount) rows.push({ kind: entry.rowKind[i] ?? 'payment', date, amount });
	});
	if (entry.paste.trim()) {
		const pasted = parsePastedRows(entry.paste);
		if ('message' in pasted) return { message: pasted.message };
		rows.push(...pasted.rows);
	}
	return { rows };
}

/** Forms pre-filled from a stored file (or empty for a new loan). */
export async function formsFor(file: LoanFile | null) {
	const termsData = file?.entryMode === 'terms' ? file.terms : undefined;
	const entryData: Partial<ScheduleEntry> | undefined =
		file?.entryMode === 'schedule'
			? {
					...file.header,
					rowKind: file.rows.map((r) => r.kind),
					rowDate: file.rows.map((r) => r.date),
					rowAmount: file.rows.map((r) => r.amount),
					paste: ''
				}
			: undefined;
	return {
		termsForm: await superValidate(termsData, termsAdapter, { id: 'terms', errors: false }),
		entryForm: await superValidate(entryData, entryAdapter, { id: 'entry', errors: false })
	};
}

type Save = (file: LoanFile) => Promise<SaveOutcome>;

/** Validates the Terms form and saves it, or returns the form with field errors. */
export async function submitTerms(request: Request, save: Save) {
	const form = await superValidate(request, termsAdapter, { id: 'terms' });
	if (!form.valid) return { form: fail(400, { form }) };
	const outcome = await save({ entryMode: 'terms', terms: normaliseTerms(form.data) });
	if (!outcome.ok)
		return {
			form: setError(
				form as SuperValidated<LoanTerms>,
				outcome.field === 'reference' ? 'reference' : 'amountOfCredit',
				outcome.message
			)
		};
	return { outcome, valid: form };
}

/** Validates the schedule entry form (rows and pasted lines) and saves it. */
export async function submitEntry(request: Request, save: Save) {
	const form = await superValidate(request, entryAdapter, { id: 'entry' });
	if (!form.valid) return { form: fail(400, { form }) };
	const parsed = entryRows(form.data);
	if ('message' in parsed) return { form: setError(form, 'paste', parsed.message) };
	const { reference, borrowerName, regime, securedByRealProperty } = form.data;
	const outcome = await save({
		entryMode: 'schedule',
		header: { reference, borrowerName, regime, securedByRealProperty },
		rows: parsed.rows
	});
	if (!outcome.ok)
		return {
			form: setError(form, outcome.field === 'reference' ? 'reference' : 'paste', outcome.message)
		};
	return { outcome, valid: form };
}
