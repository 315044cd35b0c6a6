import { and, eq, gt, isNull } from 'drizzle-orm';
import { appendAuditEvent } from '../audit/chain';
import { auditForUser } from '../auth/audit-user';
import { hashPassword, verifyPassword } from '../auth/password';
import { hashToken, newToken } from '../auth/tokens';
import { db } from '../db';
import { memberships, passwordResets, users, workspaces } from '../db/schema';

export const RESET_MINUTES = 30;
export const TRIAL_SEATS = 3;
export const TRIAL_DAYS = 14;

function slugify(name: string): string {
	const base = name
		.toLowerCase()
		.normalize('NFKD')
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 40);
	return `${base || 'workspace'}-${crypto.randomUUID().slice(0, 6)}`;
}

type SignUp = { name: string; email: string; workspace: string; password: string };

/** Creates the user, their workspace and their admin membership in one transaction. */
export async function signUp(
	input: SignUp
): Promise<
	{ ok: true; userId: string; workspaceId: string } | { ok: false; field: 'email'; message: string }
> {
	const passwordHash = await hashPassword(input.password);
	return db.transaction(async (tx) => {
		const [user] = await tx
			.insert(users)
			.values({ name: input.name, email: input.email, passwordHash })
			.onConflictDoNothing({ target: users.email })
			.returning({ id: users.id });
		if (!user) {
			return {
				ok: false as const,
				field: 'email' as const,
				message: 'An account with this e-mail exists. Sign in, or ask for a new password.'
			};
		}
		const [workspace] = await tx
			.insert(workspaces)
			.values({
				name: input.workspace,
				slug: slugify(input.workspace),
				seats: TRIAL_SEATS,
				subscriptionStatus: 'trialing',
				trialEndsAt: new Date(Date.now() + TRIAL_DAYS * 86_400_000)
			})
			.returning({ id: workspaces.id });
		const [membership] = await tx
			.insert(memberships)
			.values({ workspaceId: workspace.id, userId: user.id, role: 'admin' })
			.returning({ id: memberships.id });
		await appendAuditEvent(tx, {
			workspaceId: workspace.id,
			actorId: user.id,
			action: 'workspace.create',
			subject: `workspace:${workspace.id}`,
			payload: { name: input.workspace, seats: TRIAL_SEATS }
		});
		await appendAuditEvent(tx, {
			workspaceId: workspace.id,
			actorId: user.id,
			action: 'member.join',
			subject: `membership:${membership.id}`,
			payload: { email: input.email, role: 'admin', via: 'sign-up' }
		});
		return { ok: true as const, userId: user.id, workspaceId: workspace.id };
	});
}

/** A reset token for a known address (null when unknown; the caller answers the same either way). */
export async function createPasswordReset(email: string): Promise<string | null> {
	const [user] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
	if (!user) return null;
	const { token, tokenHash } = newToken();
	await db.insert(passwordResets).values({
		userId: user.id,
		tokenHash,
		expiresAt: new Date(Date.now() + RESET_MINUTES * 60_000)
	});
	return token;
}

export type ResetState = 'valid' | 'expired' | 'used' | 'unknown';

export async function passwordResetState(token: string): Promise<ResetState> {
	const [row] = await db
		.select()
		.from(passwordResets)
		.where(eq(passwordResets.tokenHash, hashToken(token)));
	if (!row) return 'unknown';
	if (row.usedAt) return 'used';
	if (row.expiresAt <= new Date()) return 'expired';
	return 'valid';
}

/** Sets a new password from a reset link; the link is spent in the same transaction. */
export async function resetPassword(token: string, password: string): Promise<ResetState | 'done'> {
	const passwordHash = await hashPassword(password);
	const outcome = await db.transaction(async (tx) => {
		const [spent] = await tx
			.update(passwordResets)
			.set({ usedAt: new Date() })
			.where(
				and(
					eq(passwordResets.tokenHash, hashToken(token)),
					isNull(passwordResets.usedAt),
					gt(passwordResets.expiresAt, new Date())
				)
			)
			.returning({ userId: passwordResets.userId });
		if (!spent) return null;
		await tx.update(users).set({ passwordHash }).where(eq(users.id, spent.userId));
		await auditForUser(tx, spent.userId, 'auth.password.reset');
		return spent.userId;
	});
	return outcome ? 'done' : passwordResetState(token);
}

export async function changePassword(
	userId: string,
	current: string,
	next: string
): Promise<boolean> {
	const [user] = await db
		.select({ passwordHash: users.passwordHash })
		.from(users)
		.where(eq(users.id, userId));
	if (!user || !(await verifyPassword(user.passwordHash, current))) return false;
	const passwordHash = await hashPassword(next);
	await db.transaction(async (tx) => {
		await tx.update(users).set({ passwordHash }).where(eq(users.id, userId));
		await auditForUser(tx, userId, 'auth.password.change');
	});
	return true;
}
