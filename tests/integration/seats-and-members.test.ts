import { and, count, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { newToken } from '$lib/server/auth/tokens';
import { db } from '$lib/server/db';
import { auditEvents, invitations, memberships } from '$lib/server/db/schema';
import { acceptInvitation } from '$lib/server/workspaces/invitations';
import { changeRole, invite, removeMember } from '$lib/server/workspaces/members';
import { makeMember, makeWorkspace } from '../support/fixtures';

async function memberCount(workspaceId: string) {
	const [{ n }] = await db
		.select({ n: count() })
		.from(memberships)
		.where(eq(memberships.workspaceId, workspaceId));
	return n;
}

/** An open invitation written directly, as if seats had been reduced after it was sent. */
async function rawInvitation(workspaceId: string, email: string) {
	const { token, tokenHash } = newToken();
	await db.insert(invitations).values({
		workspaceId,
		email,
		role: 'analyst',
		tokenHash,
		expiresAt: new Date(Date.now() + 86_400_000)
	});
	return token;
}

describe('seats', () => {
	it('never lets 20 concurrent acceptances exceed the seats', async () => {
		const workspace = await makeWorkspace(3);
		await makeMember(workspace.id, 'admin');
		const tokens = await Promise.all(
			Array.from({ length: 20 }, (_, i) =>
				rawInvitation(workspace.id, `race-${i}-${workspace.id.slice(0, 6)}@example.test`)
			)
		);
		const outcomes = await Promise.all(
			tokens.map((token, i) =>
				acceptInvitation(token, {
					kind: 'new',
					name: `Racer ${i}`,
					password: 'a-long-enough-password'
				})
			)
		);
		expect(outcomes.filter((o) => o.ok)).toHaveLength(2);
		const refused = outcomes.filter((o) => !o.ok);
		expect(refused).toHaveLength(18);
		for (const o of refused)
			if (!o.ok) expect(o.message).toMatch(/All 3 seats are taken.*add seats/);
		expect(await memberCount(workspace.id)).toBe(3);
	});

	it('lets only one of two simultaneous acceptances of the same invitation through', async () => {
		const workspace = await makeWorkspace(5);
		const token = await rawInvitation(
			workspace.id,
			`twice-${workspace.id.slice(0, 6)}@example.test`
		);
		const [a, b] = await Promise.all([
			acceptInvitation(token, { kind: 'new', name: 'First', password: 'a-long-enough-password' }),
			acceptInvitation(token, { kind: 'new', name: 'Second', password: 'a-long-enough-password' })
		]);
		expect([a.ok, b.ok].filter(Boolean)).toHaveLength(1);
		expect(await memberCount(workspace.id)).toBe(1);
	});

	it('refuses an invitation when members and open invitations fill the seats, writing nothing', async () => {
		const workspace = await makeWorkspace(2);
		const { user } = await makeMember(workspace.id, 'admin');
		const acting = { workspaceId: workspace.id, actorId: user.id };
		const first = await invite(acting, {
			email: `one-${workspace.id.slice(0, 6)}@example.test`,
			role: 'officer'
		});
		expect(first.ok).toBe(true);
		const second = await invite(acting, {
			email: `two-${workspace.id.slice(0, 6)}@example.test`,
			role: 'officer'
		});
		expect(second).toEqual({
			ok: false,
			field: 'email',
			message: expect.stringMatching(/All 2 seats are taken/)
		});
		const [{ n }] = await db
			.select({ n: count() })
			.from(invitations)
			.where(eq(invitations.workspaceId, workspace.id));
		expect(n).toBe(1);
		const [{ audited }] = await db
			.select({ audited: count() })
			.from(auditEvents)
			.where(
				and(eq(auditEvents.workspaceId, workspace.id), eq(auditEvents.action, 'member.invite'))
			);
		expect(audited).toBe(1);
	});
});

describe('invitations', () => {
	it('leave nothing behind when the e-mail cannot be delivered', async () => {
		const workspace = await makeWorkspace(5);
		const { user } = await makeMember(workspace.id, 'admin');
		const failing = async () => {
			throw new Error('mail server unavailable');
		};
		await expect(
			invite(
				{ workspaceId: workspace.id, actorId: user.id },
				{ email: `lost-${workspace.id.slice(0, 6)}@example.test`, role: 'reviewer' },
				failing
			)
		).rejects.toThrow('mail server unavailable');
		const [{ n }] = await db
			.select({ n: count() })
			.from(invitations)
			.where(eq(invitations.workspaceId, workspace.id));
		expect(n).toBe(0);
		const [{ audited }] = await db
			.select({ audited: count() })
			.from(auditEvents)
			.where(eq(auditEvents.workspaceId, workspace.id));
		expect(audited).toBe(0);
	});
});

describe('the last admin', () => {
	it('cannot be demoted or removed, and can once another admin exists', async () => {
		const workspace = await makeWorkspace(5);
		const { user, membership } = await makeMember(workspace.id, 'admin');
		const acting = { workspaceId: workspace.id, actorId: user.id };
		expect(await changeRole(acting, membership.id, 'reviewer')).toEqual({
			ok: false,
			message: expect.stringMatching(/at least one admin/)
		});
		expect(await removeMember(acting, membership.id)).toEqual({
			ok: false,
			message: expect.stringMatching(/at least one admin/)
		});
		const other = await makeMember(workspace.id, 'officer');
		expect(await changeRole(acting, other.membership.id, 'admin')).toEqual({ ok: true });
		expect(await changeRole(acting, membership.id, 'reviewer')).toEqual({ ok: true });
	});

	it('treats a membership of another workspace as not found', async () => {
		const mine = await makeWorkspace(5);
		const theirs = await makeWorkspace(5);
		const { user } = await makeMember(mine.id, 'admin');
		const stranger = await makeMember(theirs.id, 'officer');
		expect(
			await removeMember({ workspaceId: mine.id, actorId: user.id }, stranger.membership.id)
		).toBeNull();
		expect(await memberCount(theirs.id)).toBe(1);
	});
});
