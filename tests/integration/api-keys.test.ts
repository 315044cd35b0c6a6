// API keys against the real PostgreSQL: only a digest is stored, revocation is immediate, and the
// per-key limit counted in api_request_counts holds under concurrent requests.
import { and, eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import {
	createApiKey,
	hashApiKey,
	listApiKeys,
	revokeApiKey,
	useApiKey
} from '$lib/server/api/keys';
import { db } from '$lib/server/db';
import { apiKeys, apiRequestCounts, auditEvents } from '$lib/server/db/schema';
import { makeMember, makeWorkspace } from '../support/fixtures';

async function workspaceWithAdmin() {
	const workspace = await makeWorkspace();
	const { user } = await makeMember(workspace.id, 'admin');
	return { workspace, acting: { workspaceId: workspace.id, actorId: user.id } };
}

/** Waits out the last seconds of a minute so a burst falls into one counting window. */
async function awayFromMinuteEdge() {
	const second = new Date().getUTCSeconds();
	if (second >= 50) await new Promise((r) => setTimeout(r, (61 - second) * 1000));
}

describe('API keys', () => {
	it('stores only the SHA-256 of a new key and audits its creation without the secret', async () => {
		const { workspace, acting } = await workspaceWithAdmin();
		const made = await createApiKey(acting, { name: 'Origination system', scope: 'officer' });
		expect(made.key).toMatch(/^pincer_[A-Za-z0-9_-]{43}$/);
		const [row] = await db.select().from(apiKeys).where(eq(apiKeys.id, made.id));
		expect(row.keyHash).toBe(hashApiKey(made.key));
		expect(row.keyHash).not.toContain(made.key.slice(7));
		expect(made.key.startsWith(row.prefix)).toBe(true);
		expect(row.prefix.length).toBeLessThan(16);
		const events = await db
			.select()
			.from(auditEvents)
			.where(
				and(eq(auditEvents.workspaceId, workspace.id), eq(auditEvents.action, 'api_key.create'))
			);
		expect(events).toHaveLength(1);
		expect(JSON.stringify(events[0])).not.toContain(made.key);
		const listed = await listApiKeys(workspace.id);
		expect(listed.map((k) => k.id)).toEqual([made.id]);
		expect(Object.keys(listed[0])).not.toContain('keyHash');
	});

	it('answers unknown, malformed and revoked keys without counting them', async () => {
		const { acting } = await workspaceWithAdmin();
		const made = await createApiKey(acting, { name: 'Model', scope: 'analyst' });
		expect((await useApiKey(made.key, 10)).status).toBe('allowed');
		expect((await useApiKey(`${made.key.slice(0, -1)}x`, 10)).status).toBe('unknown');
		expect((await useApiKey('not-a-key', 10)).status).toBe('unknown');
		expect(await revokeApiKey(acting, made.id)).toBe(true);
		expect(await revokeApiKey(acting, made.id)).toBe(false);
		expect((await useApiKey(made.key, 10)).status).toBe('revoked');
		const counts = await db
			.select()
			.from(apiRequestCounts)
			.where(eq(apiRequestCounts.keyId, made.id));
		expect(counts.map((c) => c.count)).toEqual([1]);
	});

	it('refuses to revoke another workspace’s key', async () => {
		const mine = await workspaceWithAdmin();
		const theirs = await workspaceWithAdmin();
		const made = await createApiKey(theirs.acting, { name: 'Theirs', scope: 'reviewer' });
		expect(await revokeApiKey(mine.acting, made.id)).toBe(false);
		expect((await useApiKey(made.key, 10)).status).toBe('allowed');
	});

	it('limits a key to N requests a minute, exactly, under 25 concurrent requests', async () => {
		const { acting } = await workspaceWithAdmin();
		const made = await createApiKey(acting, { name: 'Busy', scope: 'officer' });
		const other = await createApiKey(acting, { name: 'Quiet', scope: 'officer' });
		await awayFromMinuteEdge();
		const uses = await Promise.all(Array.from({ length: 25 }, () => useApiKey(made.key, 10)));
		const statuses = uses.map((u) => u.status);
		expect(statuses.filter((s) => s === 'allowed')).toHaveLength(10);
		expect(statuses.filter((s) => s === 'limited')).toHaveLength(15);
		// Calls counted together still get one place each in the window: 1 to 25, none twice.
		const places = uses.map((u) => ('count' in u ? u.count : 0)).sort((a, b) => a - b);
		expect(places).toEqual(Array.from({ length: 25 }, (_, i) => i + 1));
		for (const use of uses) {
			if (use.status !== 'limited') continue;
			expect(use.retryAfter).toBeGreaterThanOrEqual(1);
			expect(use.retryAfter).toBeLessThanOrEqual(60);
		}
		expect((await useApiKey(other.key, 10)).status).toBe('allowed');
		const [key] = await db.select().from(apiKeys).where(eq(apiKeys.id, made.id));
		expect(key.lastUsedAt).not.toBeNull();
	});
});
