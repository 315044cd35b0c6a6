import Decimal from 'decimal.js';
import { and, desc, eq, isNull } from 'drizzle-orm';
import { appendAuditEvent } from '../audit/chain';
import { db } from '../db';
import { loans, toleranceChecks, users } from '../db/schema';
import { toleranceCheck } from '../solver';
import { financeChargeTolerance } from './finance-charge';
import { getLoan, type Acting } from './index';

export type CheckInput = { disclosedApr: string; disclosedFinanceCharge?: string };

/**
 * Checks an APR the officer intends to disclose (percent, e.g. "12.83") against 12 CFR 1026.22
 * and, when given, a disclosed finance charge against 1026.18(d). Stored and audited; a passing
 * check resolves the loan's earlier failed checks.
 */
export async function runToleranceCheck(acting: Acting, loanId: string, input: CheckInput) {
	const found = await getLoan(acting.workspaceId, loanId);
	if (!found) return null;
	if (found.loan.regime !== 'us-apr' || !found.solve) {
		return {
			ok: false as const,
			message: 'Tolerance checks apply to United States (Regulation Z) loans with a solved APR.'
		};
	}
	const apr = toleranceCheck(
		found.solve.result,
		new Decimal(input.disclosedApr).div(100).toString()
	);
	const fc = input.disclosedFinanceCharge
		? financeChargeTolerance(
				found.version.financeCharge,
				input.disclosedFinanceCharge,
				found.version.amountFinanced,
				found.loan.regime === 'us-apr' && headerSecured(found.file)
			)
		: null;
	const accurate = apr.accurate && (fc?.accurate ?? true);
	const detail = { apr, financeCharge: fc };
	const id = await db.transaction(async (tx) => {
		const [row] = await tx
			.insert(toleranceChecks)
			.values({
				workspaceId: acting.workspaceId,
				loanId,
				version: found.version.version,
				solveId: found.solve?.id ?? null,
				disclosedApr: input.disclosedApr,
				aprAccurate: apr.accurate,
				disclosedFinanceCharge: input.disclosedFinanceCharge ?? null,
				financeChargeAccurate: fc?.accurate ?? null,
				securedByRealProperty: headerSecured(found.file),
				detail: detail as unknown as Record<string, unknown>,
				resolvedAt: accurate ? new Date() : null,
				resolvedBy: accurate ? acting.actorId : null,
				createdBy: acting.actorId
			})
			.returning({ id: toleranceChecks.id });
		if (accurate) {
			await tx
				.update(toleranceChecks)
				.set({ resolvedAt: new Date(), resolvedBy: acting.actorId })
				.where(and(eq(toleranceChecks.loanId, loanId), isNull(toleranceChecks.resolvedAt)));
		}
		await appendAuditEvent(tx, {
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: 'loan.tolerance.check',
			subject: `loan:${loanId}`,
			payload: {
				version: found.version.version,
				disclosedApr: input.disclosedApr,
				aprAccurate: apr.accurate,
				disclosedFinanceCharge: input.disclosedFinanceCharge ?? null,
				financeChargeAccurate: fc?.accurate ?? null
			}
		});
		return row.id;
	});
	return { ok: true as const, id, accurate, apr, financeCharge: fc };
}

function headerSecured(file: {
	entryMode: string;
	terms?: { securedByRealProperty?: boolean };
	header?: { securedByRealProperty?: boolean };
}) {
	return !!(file.entryMode === 'terms'
		? file.terms?.securedByRealProperty
		: file.header?.securedByRealProperty);
}

export async function listChecks(loanId: string) {
	return db
		.select({
			id: toleranceChecks.id,
			version: toleranceChecks.version,
			disclosedApr: toleranceChecks.disclosedApr,
			aprAccurate: toleranceChecks.aprAccurate,
			disclosedFinanceCharge: toleranceChecks.disclosedFinanceCharge,
			financeChargeAccurate: toleranceChecks.financeChargeAccurate,
			detail: toleranceChecks.detail,
			resolvedAt: toleranceChecks.resolvedAt,
			createdAt: toleranceChecks.createdAt,
			by: users.name
		})
		.from(toleranceChecks)
		.leftJoin(users, eq(users.id, toleranceChecks.createdBy))
		.where(eq(toleranceChecks.loanId, loanId))
		.orderBy(desc(toleranceChecks.createdAt));
}

/** Failed checks not yet resolved: the Desk shows each as an alert. */
export async function openAlerts(workspaceId: string) {
	return db
		.select({
			id: toleranceChecks.id,
			loanId: loans.id,
			reference: loans.reference,
			borrowerName: loans.borrowerName,
			disclosedApr: toleranceChecks.disclosedApr,
			aprAccurate: toleranceChecks.aprAccurate,
			financeChargeAccurate: toleranceChecks.financeChargeAccurate,
			createdAt: toleranceChecks.createdAt
		})
		.from(toleranceChecks)
		.innerJoin(loans, eq(loans.id, toleranceChecks.loanId))
		.where(and(eq(toleranceChecks.workspaceId, workspaceId), isNull(toleranceChecks.resolvedAt)))
		.orderBy(desc(toleranceChecks.createdAt));
}

/** An officer marks a failed check as dealt with (e.g. the disclosure was corrected elsewhere). */
export async function resolveCheck(acting: Acting, checkId: string): Promise<boolean> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(toleranceChecks)
			.set({ resolvedAt: new Date(), resolvedBy: acting.actorId })
			.where(
				and(
					eq(toleranceChecks.id, checkId),
					eq(toleranceChecks.workspaceId, acting.workspaceId),
					isNull(toleranceChecks.resolvedAt)
				)
			)
			.returning({ loanId: toleranceChecks.loanId });
		if (!row) return false;
		await appendAuditEvent(tx, {
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: 'loan.tolerance.resolve',
			subject: `loan:${row.loanId}`,
			payload: { check: checkId }
		});
		return true;
	});
}
