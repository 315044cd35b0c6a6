// Domain rows → the API's documented response shapes (src/lib/schemas/api.ts). Explicit field
// lists, so a new column never leaks into the API by accident.
import type { z } from 'zod';
import type {
	auditPageSchema,
	loanListSchema,
	loanSchema,
	storedSolveSchema
} from '$lib/schemas/api';
import type { SolveRequest, SolveResult } from '$lib/schemas/solve';
import type { listAuditEvents } from '../audit';
import type { solves } from '../db/schema';
import type { getLoan, listLoans } from '../loans';

type StoredSolve = z.input<typeof storedSolveSchema>;
type SolveRow = Omit<typeof solves.$inferSelect, 'result'> & { result: unknown };

export const iso = (d: Date | string) => new Date(d).toISOString();
/** A numeric column's text without the padding zeros of its scale ("0.0787500…0" → "0.07875"). */
export const unpadded = (value: string | null) =>
	value === null ? null : value.replace(/(\.\d*?)0+$/, '$1').replace(/\.$/, '');

export function presentSolve(row: SolveRow): StoredSolve {
	return {
		id: row.id,
		kind: row.kind as StoredSolve['kind'],
		status: row.status as StoredSolve['status'],
		rate: unpadded(row.rate),
		subject: {
			type: row.subjectType as StoredSolve['subject']['type'],
			id: row.subjectId,
			version: row.subjectVersion
		},
		engineVersion: row.engineVersion,
		createdAt: iso(row.createdAt),
		request: row.request as unknown as SolveRequest,
		result: row.result as unknown as SolveResult
	};
}

type LoanFound = NonNullable<Awaited<ReturnType<typeof getLoan>>>;

export function presentLoan(found: LoanFound): z.input<typeof loanSchema> {
	const { loan, version } = found;
	return {
		id: loan.id,
		reference: loan.reference,
		borrowerName: loan.borrowerName,
		regime: loan.regime as 'us-apr' | 'eu-aprc',
		status: loan.status as 'draft' | 'disclosed',
		version: version.version,
		currentVersion: loan.currentVersion,
		disclosedVersion: loan.disclosedVersion,
		createdAt: iso(loan.createdAt),
		updatedAt: iso(loan.updatedAt),
		file: found.file,
		figures: {
			amountFinanced: version.amountFinanced,
			financeCharge: version.financeCharge,
			totalOfPayments: version.totalOfPayments
		},
		changes: version.changes,
		solve: found.solve ? presentSolve(found.solve) : null
	};
}

export function presentLoanList(
	list: Awaited<ReturnType<typeof listLoans>>,
	pageSize: number
): z.input<typeof loanListSchema> {
	return {
		items: list.rows.map((row) => ({
			id: row.id,
			reference: row.reference,
			borrowerName: row.borrowerName,
			regime: row.regime as 'us-apr' | 'eu-aprc',
			status: row.status as 'draft' | 'disclosed',
			version: row.version,
			amountFinanced: row.amountFinanced,
			rate: unpadded(row.rate),
			solveStatus: row.solveStatus as 'solved' | 'multiple-roots' | 'no-root' | null,
			updatedAt: iso(row.updatedAt)
		})),
		page: list.page,
		pages: list.pages,
		pageSize,
		total: list.total
	};
}

export function presentAuditPage(
	list: Awaited<ReturnType<typeof listAuditEvents>>,
	page: number,
	pageSize: number
): z.input<typeof auditPageSchema> {
	return {
		items: list.rows.map((row) => ({
			id: row.id,
			at: iso(row.createdAt),
			action: row.action,
			subject: row.subject,
			actor: row.actorEmail ? { email: row.actorEmail, name: row.actorName } : null,
			payload: row.payload as Record<string, unknown>,
			hash: row.hash
		})),
		page,
		pages: list.pages,
		pageSize,
		total: list.total
	};
}
