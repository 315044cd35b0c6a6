import { desc, eq } from 'drizzle-orm';
import { db } from '../db';
import { solves, users } from '../db/schema';

/** The workspace's latest solves, newest first, for the Desk. */
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
			by: users.name
		})
		.from(solves)
		.leftJoin(users, eq(users.id, solves.createdBy))
		.where(eq(solves.workspaceId, workspaceId))
		.orderBy(desc(solves.createdAt))
		.limit(limit);
}
