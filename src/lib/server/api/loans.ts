// Loans through the API: the same services as the loan screens, with their outcomes mapped onto
// API errors and the documented response shapes.
import type { LoanInput } from '$lib/schemas/api';
import { createLoan, getLoan, listLoans, updateLoan, type LoanListQuery } from '../loans';
import type { LoanFile } from '../loans/file';
import { normaliseTerms } from '../loans/forms';
import { ApiError } from './errors';
import { notFound } from './input';
import { presentLoan, presentLoanList } from './present';

/** Rows per page of GET /loans (the loans list's own page size). */
export const LOANS_PAGE_SIZE = 25;

type Acting = { workspaceId: string; actorId: string };

const fileOf = (input: LoanInput): LoanFile =>
	input.entryMode === 'terms' ? { entryMode: 'terms', terms: normaliseTerms(input.terms) } : input;

/** Creates (loanId null) or versions a loan; returns the stored loan as GET /loans/{id} shows it. */
export async function saveLoan(acting: Acting, loanId: string | null, input: LoanInput) {
	const file = fileOf(input);
	const outcome = loanId ? await updateLoan(acting, loanId, file) : await createLoan(acting, file);
	if (!outcome.ok) {
		if (outcome.field === 'loan') throw notFound();
		const at =
			outcome.field === 'reference'
				? `${input.entryMode === 'terms' ? 'terms' : 'header'}.reference`
				: outcome.field;
		throw new ApiError(
			outcome.field === 'reference' ? 409 : 422,
			outcome.field === 'reference' ? 'conflict' : 'validation_failed',
			outcome.message,
			{ [at]: [outcome.message] }
		);
	}
	return loanById(acting.workspaceId, outcome.loanId);
}

export async function loanById(workspaceId: string, loanId: string, version?: number) {
	const found = await getLoan(workspaceId, loanId, version);
	if (!found) throw notFound();
	return presentLoan(found);
}

export async function loanPage(workspaceId: string, query: LoanListQuery) {
	return presentLoanList(await listLoans(workspaceId, query), LOANS_PAGE_SIZE);
}
