import { and, desc, eq } from 'drizzle-orm';
import { db } from '../db';
import { deals, loans, solves, users } from '../db/schema';

/** The workspace's latest solves, newest first, with what they were for, for the Desk. */
export async function recentSolves(workspaceId: string, limit = 12) {
	return db
		.select({
			id: solves.id,
			subjectType: solves.subjectType,
			subjectId: solves.subjectId,
			subjectVersion: solves.subjectVersion,
			kind: solves.kind,
			status: solves.status,
			rate: solves.rate,
			createdAt: solves.createdAt,
			by: users.name,
			loanReference: loans.reference,
			dealName: deals.name
		})
		.from(solves)
		.leftJoin(users, eq(users.id, solves.createdBy))
		.leftJoin(loans, and(eq(solves.subjectType, 'loan'), eq(loans.id, solves.subjectId)))
		.leftJoin(deals, and(eq(solves.subjectType, 'deal'), eq(deals.id, solves.subjectId)))
		.where(eq(solves.workspaceId, workspaceId))
		.orderBy(desc(solves.createdAt))
		.limit(limit);
}
