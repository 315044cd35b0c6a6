import { eq } from 'drizzle-orm';
import { appendAuditEvent } from '../audit/chain';
import { memberships } from '../db/schema';
import type { Executor } from '../db/types';

/**
 * Records an account-level event (sign-in, sign-out, password change) in the chain of every
 * workspace the user belongs to, or in the global chain when they belong to none. Pass the
 * transaction that makes the change.
 */
export async function auditForUser(
	tx: Executor,
	userId: string,
	action: string,
	payload: Record<string, unknown> = {}
) {
	const rows = await tx
		.select({ workspaceId: memberships.workspaceId })
		.from(memberships)
		.where(eq(memberships.userId, userId));
	const targets = rows.length ? rows.map((r) => r.workspaceId) : [null];
	for (const workspaceId of targets) {
		await appendAuditEvent(tx, {
			workspaceId,
			actorId: userId,
			action,
			subject: `user:${userId}`,
			payload
		});
	}
}
