import { and, asc, count, desc, eq, gt, isNull, ne, sql } from 'drizzle-orm';
import { appendAuditEvent } from '../audit/chain';
import { newToken } from '../auth/tokens';
import { db } from '../db';
import { invitations, memberships, users, workspaces, type Role } from '../db/schema';
import type { Executor } from '../db/types';

export const INVITATION_DAYS = 7;

type Acting = { workspaceId: string; actorId: string };
export type Refusal = { ok: false; message: string; field?: string };

export async function listMembers(workspaceId: string) {
	return db
		.select({
			membershipId: memberships.id,
			userId: users.id,
			name: users.name,
			email: users.email,
			role: memberships.role,
			since: memberships.createdAt
		})
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(eq(memberships.workspaceId, workspaceId))
		.orderBy(asc(memberships.createdAt));
}

export async function listPendingInvitations(workspaceId: string) {
	return db
		.select({
			id: invitations.id,
			email: invitations.email,
			role: invitations.role,
			expiresAt: invitations.expiresAt,
			createdAt: invitations.createdAt
		})
		.from(invitations)
		.where(
			and(
				eq(invitations.workspaceId, workspaceId),
				isNull(invitations.acceptedAt),
				isNull(invitations.revokedAt),
				gt(invitations.expiresAt, new Date())
			)
		)
		.orderBy(desc(invitations.createdAt));
}

/** Members plus open invitations, with the workspace row locked so concurrent changes queue. */
export async function seatUse(tx: Executor, workspaceId: string) {
	const [workspace] = await tx
		.select({ seats: workspaces.seats, name: workspaces.name })
		.from(workspaces)
		.where(eq(workspaces.id, workspaceId))
		.for('update');
	const [{ members }] = await tx
		.select({ members: count() })
		.from(memberships)
		.where(eq(memberships.workspaceId, workspaceId));
	const [{ pending }] = await tx
		.select({ pending: count() })
		.from(invitations)
		.where(
			and(
				eq(invitations.workspaceId, workspaceId),
				isNull(invitations.acceptedAt),
				isNull(invitations.revokedAt),
				gt(invitations.expiresAt, sql`now()`)
			)
		);
	return { seats: workspace.seats, name: workspace.name, members, pending };
}

export const seatsFullMessage = (seats: number) =>
	`All ${seats} seats are taken. An admin can add seats under Settings → Billing and seats, or remove a member first.`;

/**
 * Creates an invitation and delivers its one-time link through `deliver` before committing:
 * if the e-mail cannot be sent, no invitation and no audit row remain.
 */
export async function invite(
	acting: Acting,
	input: { email: string; role: Role },
	deliver: (token: string, workspaceName: string) => Promise<void> = async () => {}
): Promise<{ ok: true; token: string; invitationId: string; workspaceName: string } | Refusal> {
	return db.transaction(async (tx) => {
		const use = await seatUse(tx, acting.workspaceId);
		const [already] = await tx
			.select({ id: memberships.id })
			.from(memberships)
			.innerJoin(users, eq(users.id, memberships.userId))
			.where(and(eq(memberships.workspaceId, acting.workspaceId), eq(users.email, input.email)));
		if (already)
			return { ok: false, field: 'email', message: `${input.email} is already a member.` };
		const [open] = await tx
			.select({ id: invitations.id })
			.from(invitations)
			.where(
				and(
					eq(invitations.workspaceId, acting.workspaceId),
					eq(invitations.email, input.email),
					isNull(invitations.acceptedAt),
					isNull(invitations.revokedAt),
					gt(invitations.expiresAt, sql`now()`)
				)
			);
		if (open) {
			return {
				ok: false,
				field: 'email',
				message: `${input.email} has an open invitation; resend it below.`
			};
		}
		if (use.members + use.pending >= use.seats) {
			return { ok: false, field: 'email', message: seatsFullMessage(use.seats) };
		}
		const { token, tokenHash } = newToken();
		const [row] = await tx
			.insert(invitations)
			.values({
				workspaceId: acting.workspaceId,
				email: input.email,
				role: input.role,
				tokenHash,
				invitedBy: acting.actorId,
				expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000)
			})
			.returning({ id: invitations.id });
		await appendAuditEvent(tx, {
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: 'member.invite',
			subject: `invitation:${row.id}`,
			payload: { email: input.email, role: input.role }
		});
		await deliver(token, use.name);
		return { ok: true, token, invitationId: row.id, workspaceName: use.name };
	});
}

/** Replaces an open invitation's token (the old link stops working), restarts its 7 days and delivers it. */
export async function resendInvitation(
	acting: Acting,
	invitationId: string,
	deliver: (token: string, email: string, role: Role) => Promise<void> = async () => {}
) {
	return db.transaction(async (tx) => {
		const { token, tokenHash } = newToken();
		const [row] = await tx
			.update(invitations)
			.set({ tokenHash, expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000) })
			.where(
				and(
					eq(invitations.id, invitationId),
					eq(invitations.workspaceId, acting.workspaceId),
					isNull(invitations.acceptedAt),
					isNull(invitations.revokedAt)
				)
			)
			.returning({ email: invitations.email, role: invitations.role });
		if (!row) return null;
		await appendAuditEvent(tx, {
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: 'member.invite.resend',
			subject: `invitation:${invitationId}`,
			payload: { email: row.email }
		});
		await deliver(token, row.email, row.role);
		return { token, ...row };
	});
}

export async function revokeInvitation(acting: Acting, invitationId: string): Promise<boolean> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(invitations)
			.set({ revokedAt: new Date() })
			.where(
				and(
					eq(invitations.id, invitationId),
					eq(invitations.workspaceId, acting.workspaceId),
					isNull(invitations.acceptedAt),
					isNull(invitations.revokedAt)
				)
			)
			.returning({ email: invitations.email });
		if (!row) return false;
		await appendAuditEvent(tx, {
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: 'member.invite.revoke',
			subject: `invitation:${invitationId}`,
			payload: { email: row.email }
		});
		return true;
	});
}

async function otherAdmins(tx: Executor, workspaceId: string, membershipId: string) {
	const [{ n }] = await tx
		.select({ n: count() })
		.from(memberships)
		.where(
			and(
				eq(memberships.workspaceId, workspaceId),
				eq(memberships.role, 'admin'),
				ne(memberships.id, membershipId)
			)
		);
	return n;
}

const lastAdmin = 'A workspace needs at least one admin: make someone else admin first.';

export async function changeRole(
	acting: Acting,
	membershipId: string,
	role: Role
): Promise<{ ok: true } | Refusal | null> {
	return db.transaction(async (tx) => {
		// Lock the workspace so two demotions cannot both pass the last-admin check.
		await tx
			.select({ id: workspaces.id })
			.from(workspaces)
			.where(eq(workspaces.id, acting.workspaceId))
			.for('update');
		const [member] = await tx
			.select({ role: memberships.role, userId: memberships.userId })
			.from(memberships)
			.where(
				and(eq(memberships.id, membershipId), eq(memberships.workspaceId, acting.workspaceId))
			);
		if (!member) return null;
		if (member.role === role) return { ok: true as const };
		if (
			member.role === 'admin' &&
			(await otherAdmins(tx, acting.workspaceId, membershipId)) === 0
		) {
			return { ok: false as const, message: lastAdmin };
		}
		await tx.update(memberships).set({ role }).where(eq(memberships.id, membershipId));
		await appendAuditEvent(tx, {
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: 'member.role.change',
			subject: `membership:${membershipId}`,
			payload: { userId: member.userId, from: member.role, to: role }
		});
		return { ok: true as const };
	});
}

export async function removeMember(
	acting: Acting,
	membershipId: string
): Promise<{ ok: true } | Refusal | null> {
	return db.transaction(async (tx) => {
		await tx
			.select({ id: workspaces.id })
			.from(workspaces)
			.where(eq(workspaces.id, acting.workspaceId))
			.for('update');
		const [member] = await tx
			.select({ role: memberships.role, userId: memberships.userId, email: users.email })
			.from(memberships)
			.innerJoin(users, eq(users.id, memberships.userId))
			.where(
				and(eq(memberships.id, membershipId), eq(memberships.workspaceId, acting.workspaceId))
			);
		if (!member) return null;
		if (
			member.role === 'admin' &&
			(await otherAdmins(tx, acting.workspaceId, membershipId)) === 0
		) {
			return { ok: false as const, message: lastAdmin };
		}
		await tx.delete(memberships).where(eq(memberships.id, membershipId));
		await appendAuditEvent(tx, {
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: 'member.remove',
			subject: `membership:${membershipId}`,
			payload: { userId: member.userId, email: member.email, role: member.role }
		});
		return { ok: true as const };
	});
}
