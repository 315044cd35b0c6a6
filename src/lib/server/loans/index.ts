import { and, asc, count, desc, eq, ilike, or, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { SolveResult } from '$lib/schemas/solve';
import { appendAuditEvent } from '../audit/chain';
import { db } from '../db';
import { loans, loanVersions, solves, users } from '../db/schema';
import { solveAndRecord } from '../solves';
import {
	describeChanges,
	figuresOf,
	headerOf,
	scheduleProblems,
	solveRequestOf,
	type LoanFile
} from './file';

export type Acting = { workspaceId: string; actorId: string };
export type SaveOutcome =
	{ ok: true; loanId: string; version: number } | { ok: false; field: string; message: string };

const PAGE = 25;

async function saveVersion(
	acting: Acting,
	loanId: string | null,
	file: LoanFile
): Promise<SaveOutcome> {
	const figures = figuresOf(file);
	const problems = scheduleProblems(figures);
	if (problems.length) return { ok: false, field: 'rows', message: problems.join(' ') };
	const header = headerOf(file);
	try {
		return await db.transaction(async (tx) => {
			let id = loanId;
			let version = 1;
			let previous: LoanFile | null = null;
			if (id) {
				const [loan] = await tx
					.select({ currentVersion: loans.currentVersion })
					.from(loans)
					.where(and(eq(loans.id, id), eq(loans.workspaceId, acting.workspaceId)))
					.for('update');
				if (!loan) return { ok: false as const, field: 'loan', message: 'Not found' };
				const [last] = await tx
					.select({ terms: loanVersions.terms })
					.from(loanVersions)
					.where(and(eq(loanVersions.loanId, id), eq(loanVersions.version, loan.currentVersion)));
				previous = (last?.terms as LoanFile | undefined) ?? null;
				version = loan.currentVersion + 1;
				await tx
					.update(loans)
					.set({
						...header,
						currentVersion: version,
						status: 'draft',
						updatedBy: acting.actorId,
						updatedAt: new Date()
					})
					.where(eq(loans.id, id));
			} else {
				const [created] = await tx
					.insert(loans)
					.values({
						workspaceId: acting.workspaceId,
						...header,
						createdBy: acting.actorId,
						updatedBy: acting.actorId
					})
					.returning({ id: loans.id });
				id = created.id;
			}
			const solved = await solveAndRecord(
				tx,
				acting,
				{ type: 'loan', id, version },
				solveRequestOf(file, figures)
			);
			const changes = describeChanges(previous, file);
			await tx.insert(loanVersions).values({
				loanId: id,
				version,
				entryMode: file.entryMode,
				terms: file as unknown as Record<string, unknown>,
				amountFinanced: figures.amountFinanced,
				financeCharge: figures.financeCharge,
				totalOfPayments: figures.totalOfPayments,
				solveId: solved.id,
				changes,
				createdBy: acting.actorId
			});
			await appendAuditEvent(tx, {
				workspaceId: acting.workspaceId,
				actorId: acting.actorId,
				action: version === 1 ? 'loan.create' : 'loan.update',
				subject: `loan:${id}`,
				payload: {
					reference: header.reference,
					version,
					changes,
					amountFinanced: figures.amountFinanced
				}
			});
			return { ok: true as const, loanId: id, version };
		});
	} catch (err) {
		if (
			(err as { code?: string; constraint_name?: string }).constraint_name ===
				'loans_workspace_reference_key' ||
			(err as { cause?: { constraint_name?: string } }).cause?.constraint_name ===
				'loans_workspace_reference_key'
		) {
			return {
				ok: false,
				field: 'reference',
				message: `Another loan in this workspace already uses the reference ${header.reference}.`
			};
		}
		throw err;
	}
}

/** Creates a loan file with its first version and solve. */
export const createLoan = (acting: Acting, file: LoanFile) => saveVersion(acting, null, file);
/** Saves a new version (never overwrites); a disclosed loan returns to draft until disclosed again. */
export const updateLoan = (acting: Acting, loanId: string, file: LoanFile) =>
	saveVersion(acting, loanId, file);

const creator = alias(users, 'creator');
const updater = alias(users, 'updater');

export type LoanListQuery = {
	q?: string;
	status?: 'draft' | 'disclosed';
	sort?: 'updated' | 'reference' | 'borrower';
	page?: number;
};

export async function listLoans(workspaceId: string, query: LoanListQuery) {
	const page = Math.max(1, query.page ?? 1);
	const like = query.q ? `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : null;
	const where = and(
		eq(loans.workspaceId, workspaceId),
		like ? or(ilike(loans.reference, like), ilike(loans.borrowerName, like)) : undefined,
		query.status ? eq(loans.status, query.status) : undefined
	);
	const order =
		query.sort === 'reference'
			? asc(loans.reference)
			: query.sort === 'borrower'
				? asc(loans.borrowerName)
				: desc(loans.updatedAt);
	const [rows, [{ total }]] = await Promise.all([
		db
			.select({
				id: loans.id,
				reference: loans.reference,
				borrowerName: loans.borrowerName,
				regime: loans.regime,
				status: loans.status,
				version: loans.currentVersion,
				updatedAt: loans.updatedAt,
				createdBy: creator.name,
				updatedBy: updater.name,
				amountFinanced: loanVersions.amountFinanced,
				rate: solves.rate,
				solveStatus: solves.status
			})
			.from(loans)
			.leftJoin(
				loanVersions,
				and(eq(loanVersions.loanId, loans.id), eq(loanVersions.version, loans.currentVersion))
			)
			.leftJoin(solves, eq(solves.id, loanVersions.solveId))
			.leftJoin(creator, eq(creator.id, loans.createdBy))
			.leftJoin(updater, eq(updater.id, loans.updatedBy))
			.where(where)
			.orderBy(order, asc(loans.id))
			.limit(PAGE)
			.offset((page - 1) * PAGE),
		db.select({ total: count() }).from(loans).where(where)
	]);
	return { rows, total, page, pages: Math.max(1, Math.ceil(total / PAGE)) };
}

/** A loan of this workspace with its current version and solve; null when not found here. */
export async function getLoan(workspaceId: string, loanId: string, version?: number) {
	const [loan] = await db
		.select()
		.from(loans)
		.where(and(eq(loans.id, loanId), eq(loans.workspaceId, workspaceId)));
	if (!loan) return null;
	const [current] = await db
		.select({ version: loanVersions, solve: solves })
		.from(loanVersions)
		.leftJoin(solves, eq(solves.id, loanVersions.solveId))
		.where(
			and(eq(loanVersions.loanId, loanId), eq(loanVersions.version, version ?? loan.currentVersion))
		);
	if (!current) return null;
	return {
		loan,
		version: current.version,
		file: current.version.terms as unknown as LoanFile,
		solve: current.solve
			? { ...current.solve, result: current.solve.result as unknown as SolveResult }
			: null
	};
}

export async function listVersions(loanId: string) {
	return db
		.select({
			version: loanVersions.version,
			changes: loanVersions.changes,
			amountFinanced: loanVersions.amountFinanced,
			financeCharge: loanVersions.financeCharge,
			rate: solves.rate,
			createdAt: loanVersions.createdAt,
			createdBy: users.name
		})
		.from(loanVersions)
		.leftJoin(solves, eq(solves.id, loanVersions.solveId))
		.leftJoin(users, eq(users.id, loanVersions.createdBy))
		.where(eq(loanVersions.loanId, loanId))
		.orderBy(desc(loanVersions.version));
}

/** Copies a loan's current terms into a new draft loan with a fresh reference. */
export async function duplicateLoan(acting: Acting, loanId: string): Promise<SaveOutcome | null> {
	const found = await getLoan(acting.workspaceId, loanId);
	if (!found) return null;
	const [{ n }] = await db
		.select({ n: count() })
		.from(loans)
		.where(
			and(
				eq(loans.workspaceId, acting.workspaceId),
				ilike(loans.reference, `${found.loan.reference} (copy%`)
			)
		);
	const reference = `${found.loan.reference} (copy${n ? ` ${n + 1}` : ''})`;
	const file: LoanFile =
		found.file.entryMode === 'terms'
			? { entryMode: 'terms', terms: { ...found.file.terms, reference } }
			: {
					entryMode: 'schedule',
					header: { ...found.file.header, reference },
					rows: found.file.rows
				};
	return createLoan(acting, file);
}

/** Marks the current version as the one disclosed to the borrower. */
export async function markDisclosed(acting: Acting, loanId: string): Promise<boolean> {
	return db.transaction(async (tx) => {
		const [loan] = await tx
			.update(loans)
			.set({
				status: 'disclosed',
				disclosedVersion: sql`${loans.currentVersion}`,
				updatedBy: acting.actorId,
				updatedAt: new Date()
			})
			.where(and(eq(loans.id, loanId), eq(loans.workspaceId, acting.workspaceId)))
			.returning({ version: loans.currentVersion, reference: loans.reference });
		if (!loan) return false;
		await appendAuditEvent(tx, {
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: 'loan.disclose',
			subject: `loan:${loanId}`,
			payload: { reference: loan.reference, version: loan.version }
		});
		return true;
	});
}
