// A loan file's inputs as stored in a version, and what follows from them: the figures and the
// engine request. Pure; no database.
import type { LoanTerms, ScheduleRow } from '../../schemas/loan';
import type { SolveRequest } from '../../schemas/solve';
import { scheduleFromRows, scheduleFromTerms, type LoanFigures } from './schedule';

export type LoanHeader = Pick<
	LoanTerms,
	'reference' | 'borrowerName' | 'regime' | 'securedByRealProperty'
>;
export type LoanFile =
	| { entryMode: 'terms'; terms: LoanTerms }
	| { entryMode: 'schedule'; header: LoanHeader; rows: ScheduleRow[] };

export function headerOf(file: LoanFile): LoanHeader {
	if (file.entryMode === 'schedule') return file.header;
	const { reference, borrowerName, regime, securedByRealProperty } = file.terms;
	return { reference, borrowerName, regime, securedByRealProperty };
}

export function figuresOf(file: LoanFile): LoanFigures {
	return file.entryMode === 'terms' ? scheduleFromTerms(file.terms) : scheduleFromRows(file.rows);
}

/** The engine request for a loan: Appendix J APR (US) or Annex I APRC (EU, actual days). */
export function solveRequestOf(file: LoanFile, figures: LoanFigures): SolveRequest {
	const payments = figures.payments.map((p) => ({ date: p.date, amount: p.amount }));
	if (headerOf(file).regime === 'eu-aprc') {
		return {
			kind: 'aprc-eu',
			drawdowns: figures.advances,
			repayments: payments,
			timeBasis: 'days'
		};
	}
	return { kind: 'apr-us', advances: figures.advances, payments };
}

/** Problems that make a schedule unsolvable, said plainly before the engine runs. */
export function scheduleProblems(figures: LoanFigures): string[] {
	const problems: string[] = [];
	if (figures.advances.length === 0)
		problems.push('The schedule has no advance: add the money lent.');
	if (figures.payments.length === 0)
		problems.push('The schedule has no payment: a loan must be repaid.');
	const start = figures.advances.map((a) => a.date).sort()[0];
	const early = figures.payments.find((p) => start && p.date < start);
	if (early)
		problems.push(
			`Payment ${early.number} (${early.date}) falls before the first advance (${start}).`
		);
	return problems;
}

const labels: Record<string, string> = {
	reference: 'reference',
	borrowerName: 'borrower',
	regime: 'regime',
	securedByRealProperty: 'secured by real property',
	amountOfCredit: 'amount of credit',
	noteRate: 'note rate',
	numberOfPayments: 'number of payments',
	frequency: 'frequency',
	advanceDate: 'date of the advance',
	firstPaymentDate: 'first payment date',
	balloon: 'balloon',
	rounding: 'rounding rule'
};

/** What changed between two versions, in words ("note rate 9.5 → 9.75"). */
export function describeChanges(before: LoanFile | null, after: LoanFile): string[] {
	if (!before) return ['first version'];
	if (before.entryMode !== after.entryMode)
		return [`entry switched to ${after.entryMode === 'terms' ? 'terms' : 'schedule entry'}`];
	const changes: string[] = [];
	const a = before.entryMode === 'terms' ? before.terms : { ...before.header };
	const b = after.entryMode === 'terms' ? after.terms : { ...after.header };
	for (const key of Object.keys(labels)) {
		const x = (a as Record<string, unknown>)[key];
		const y = (b as Record<string, unknown>)[key];
		if (x !== undefined && y !== undefined && String(x) !== String(y))
			changes.push(`${labels[key]} ${x || '—'} → ${y || '—'}`);
	}
	if (before.entryMode === 'terms' && after.entryMode === 'terms') {
		const fees = (t: LoanTerms) =>
			t.feeAmount.map((amount, i) => `${t.feeName[i]}:${amount}:${t.feeKind[i]}`).join('|');
		if (fees(before.terms) !== fees(after.terms)) changes.push('fees changed');
	}
	if (before.entryMode === 'schedule' && after.entryMode === 'schedule') {
		if (JSON.stringify(before.rows) !== JSON.stringify(after.rows))
			changes.push(`schedule rows changed (${before.rows.length} → ${after.rows.length})`);
	}
	return changes.length ? changes : ['saved without changes'];
}
