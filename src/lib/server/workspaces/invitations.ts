import { and, count, eq, gt, isNull } from 'drizzle-orm';
import { appendAuditEvent } from '../audit/chain';
import { hashPassword } from '../auth/password';
import { hashToken } from '../auth/tokens';
import { db } from '../db';
import { invitations, memberships, users, workspaces } from '../db/schema';
import { seatsFullMessage } from './members';

export type InvitationState = 'valid' | 'expired' | 'used' | 'revoked' | 'unknown';

/** What the invitation page shows for a token: who invited whom to which workspace, and whether it still works. */
export async function findInvitation(token: string) {
	const [row] = await db
		.select({
			id: invitations.id,
			email: invitations.email,
			role: invitations.role,
			workspaceId: invitations.workspaceId,
			workspaceName: workspaces.name,
			invitedBy: users.name,
			expiresAt: invitations.expiresAt,
			acceptedAt: invitations.acceptedAt,
			revokedAt: invitations.revokedAt
		})
		.from(invitations)
		.innerJoin(workspaces, eq(workspaces.id, invitations.workspaceId))
		.leftJoin(users, eq(users.id, invitations.invitedBy))
		.where(eq(invitations.tokenHash, hashToken(token)));
	if (!row) return { state: 'unknown' as const, invitation: null };
	const state: InvitationState = row.revokedAt
		? 'revoked'
		: row.acceptedAt
			? 'used'
			: row.expiresAt <= new Date()
				? 'expired'
				: 'valid';
	const [existing] = await db
		.select({ id: users.id })
		.from(users)
		.where(eq(users.email, row.email));
	return { state, invitation: { ...row, hasAccount: !!existing } };
}

type Accepting =
	| { kind: 'existing'; userId: string; email: string }
	| { kind: 'new'; name: string; password: string };

export type AcceptOutcome =
	| { ok: true; userId: string; workspaceId: string }
	| {
			ok: false;
			reason: InvitationState | 'seats' | 'wrong-account' | 'account-exists';
			message: string;
	  };

/**
 * Accepts an invitation: spends the token, creates the account if needed, and adds the
 * membership, all in one transaction. The workspace row is locked first, so concurrent
 * acceptances queue and can never take more seats than the workspace has.
 */
export async function acceptInvitation(token: string, who: Accepting): Promise<AcceptOutcome> {
	const passwordHash = who.kind === 'new' ? await hashPassword(who.password) : null;
	const found = await findInvitation(token);
	if (!found.invitation || found.state !== 'valid') {
		return { ok: false, reason: found.state, message: stateMessage(found.state) };
	}
	const invitation = found.invitation;
	if (who.kind === 'existing' && who.email !== invitation.email) {
		return {
			ok: false,
			reason: 'wrong-account',
			message: `This invitation is for ${invitation.email}, but you are signed in as ${who.email}. Sign out and open the link again.`
		};
	}
	return db
		.transaction(async (tx) => {
			const [workspace] = await tx
				.select({ seats: workspaces.seats })
				.from(workspaces)
				.where(eq(workspaces.id, invitation.workspaceId))
				.for('update');
			const [{ members }] = await tx
				.select({ members: count() })
				.from(memberships)
				.where(eq(memberships.workspaceId, invitation.workspaceId));
			if (members >= workspace.seats) {
				return {
					ok: false as const,
					reason: 'seats' as const,
					message: seatsFullMessage(workspace.seats)
				};
			}
			let userId: string;
			if (who.kind === 'new') {
				const [user] = await tx
					.insert(users)
					.values({
						name: who.name,
						email: invitation.email,
						passwordHash,
						emailVerified: new Date()
					})
					.onConflictDoNothing({ target: users.email })
					.returning({ id: users.id });
				if (!user) {
					return {
						ok: false as const,
						reason: 'account-exists' as const,
						message: `An account for ${invitation.email} exists: sign in first, then open the link again.`
					};
				}
				userId = user.id;
			} else {
				userId = who.userId;
			}
			const [spent] = await tx
				.update(invitations)
				.set({ acceptedAt: new Date(), acceptedBy: userId })
				.where(
					and(
						eq(invitations.id, invitation.id),
						isNull(invitations.acceptedAt),
						isNull(invitations.revokedAt),
						gt(invitations.expiresAt, new Date())
					)
				)
				.returning({ id: invitations.id });
			// Another request spent the token between our read and this update: undo everything.
			if (!spent) throw new SpentMeanwhile();
			const [membership] = await tx
				.insert(memberships)
				.values({ workspaceId: invitation.workspaceId, userId, role: invitation.role })
				.onConflictDoNothing()
				.returning({ id: memberships.id });
			await appendAuditEvent(tx, {
				workspaceId: invitation.workspaceId,
				actorId: userId,
				action: membership ? 'member.join' : 'member.invite.accept-existing',
				subject: `invitation:${invitation.id}`,
				payload: {
					email: invitation.email,
					role: invitation.role,
					membershipId: membership?.id ?? null
				}
			});
			return { ok: true as const, userId, workspaceId: invitation.workspaceId };
		})
		.catch((err: unknown) => {
			if (err instanceof SpentMeanwhile) {
				return { ok: false as const, reason: 'used' as const, message: stateMessage('used') };
			}
			throw err;
		});
}

class SpentMeanwhile extends Error {}

export function stateMessage(state: InvitationState): string {
	switch (state) {
		case 'expired':
			return 'This invitation has expired (they last 7 days). Ask the admin who invited you to resend it.';
		case 'used':
			return 'This invitation has been used already. Sign in to reach the workspace.';
		case 'revoked':
			return 'This invitation was withdrawn by an admin of the workspace.';
		case 'unknown':
			return 'This invitation link is not valid. Check that the whole address was copied, or ask for a new one.';
		default:
			return '';
	}
}
