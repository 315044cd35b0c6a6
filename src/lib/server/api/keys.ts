// API keys: made once, shown once, kept only as a SHA-256 digest. A key acts in its workspace
// with the role of its scope; its creator is the actor recorded in the audit trail.
import { createHash, randomBytes } from 'node:crypto';
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import { appendAuditEvent } from '../audit/chain';
import type { Standing } from '../billing/status';
import { db } from '../db';
import { grouped } from '../db/grouped';
import { apiKeys, users, type Role } from '../db/schema';

export const KEY_PREFIX = 'pincer_';
const KEY_PATTERN = /^pincer_[A-Za-z0-9_-]{43}$/;
/** Characters of the key kept in clear so people can tell their keys apart. */
const SHOWN = KEY_PREFIX.length + 6;

export type KeyScope = Exclude<Role, 'admin'>;
export const keyScopes: KeyScope[] = ['officer', 'analyst', 'reviewer'];

export const hashApiKey = (key: string) => createHash('sha256').update(key).digest('hex');

/** A new random key: `pincer_` and 32 random bytes in base64url (256 bits). */
export function newApiKey() {
	const key = `${KEY_PREFIX}${randomBytes(32).toString('base64url')}`;
	return { key, prefix: key.slice(0, SHOWN), keyHash: hashApiKey(key) };
}

type Acting = { workspaceId: string; actorId: string };

/** Creates a key and audits it; the returned `key` is the only time the secret exists in clear. */
export async function createApiKey(acting: Acting, input: { name: string; scope: KeyScope }) {
	const made = newApiKey();
	return db.transaction(async (tx) => {
		const [row] = await tx
			.insert(apiKeys)
			.values({
				workspaceId: acting.workspaceId,
				name: input.name,
				scope: input.scope,
				prefix: made.prefix,
				keyHash: made.keyHash,
				createdBy: acting.actorId
			})
			.returning({ id: apiKeys.id });
		await appendAuditEvent(tx, {
			...acting,
			action: 'api_key.create',
			subject: `api_key:${row.id}`,
			payload: { name: input.name, scope: input.scope, prefix: made.prefix }
		});
		return { id: row.id, key: made.key, prefix: made.prefix };
	});
}

/** The workspace's keys, newest first, without their digests. */
export async function listApiKeys(workspaceId: string) {
	return db
		.select({
			id: apiKeys.id,
			name: apiKeys.name,
			scope: apiKeys.scope,
			prefix: apiKeys.prefix,
			createdAt: apiKeys.createdAt,
			createdBy: users.name,
			lastUsedAt: apiKeys.lastUsedAt,
			revokedAt: apiKeys.revokedAt
		})
		.from(apiKeys)
		.leftJoin(users, eq(users.id, apiKeys.createdBy))
		.where(eq(apiKeys.workspaceId, workspaceId))
		.orderBy(desc(apiKeys.createdAt));
}

/** Revokes a live key of this workspace; false when there is none (other workspace, or already revoked). */
export async function revokeApiKey(acting: Acting, keyId: string): Promise<boolean> {
	return db.transaction(async (tx) => {
		const [row] = await tx
			.update(apiKeys)
			.set({ revokedAt: new Date() })
			.where(
				and(
					eq(apiKeys.id, keyId),
					eq(apiKeys.workspaceId, acting.workspaceId),
					isNull(apiKeys.revokedAt)
				)
			)
			.returning({ name: apiKeys.name, prefix: apiKeys.prefix });
		if (!row) return false;
		await appendAuditEvent(tx, {
			...acting,
			action: 'api_key.revoke',
			subject: `api_key:${keyId}`,
			payload: { name: row.name, prefix: row.prefix }
		});
		return true;
	});
}

export type KeyUse =
	| { status: 'unknown' }
	| { status: 'revoked' }
	| {
			status: 'allowed' | 'limited';
			keyId: string;
			workspaceId: string;
			/** The workspace's subscription standing (a read-only workspace refuses writes). */
			standing: Standing;
			scope: KeyScope;
			actorId: string | null;
			/** Requests of this key in the current minute, this one included. */
			count: number;
			/** Seconds until the current minute's window closes. */
			retryAfter: number;
	  };

type KeyRow = {
	id: string;
	workspace_id: string;
	workspace_name: string;
	subscription_status: string;
	trial_ends_at: Date | string | null;
	scope: KeyScope;
	created_by: string | null;
	revoked: boolean;
	count: number | null;
	seconds_left: string | null;
	fresh: boolean | null;
} & Record<string, unknown>;

/**
 * Looks a presented key up by its digest and, when it is live, counts this request in the key's
 * per-minute window (fixed windows in api_request_counts, so the limit holds across server
 * processes) and refreshes its last use at most once a minute. Calls with one key that arrive
 * while its lookup is under way are counted together by the next one (db/grouped.ts): the
 * counter row is updated once per group, by the group's size, and each call gets its own place
 * in the window's count, exactly as if they had come one by one.
 */
export function useApiKey(presented: string, limitPerMinute: number): Promise<KeyUse> {
	if (!KEY_PATTERN.test(presented)) return Promise.resolve({ status: 'unknown' });
	return countUse(hashApiKey(presented), limitPerMinute);
}

const countUse = grouped<number, KeyUse>(countUses, { items: 1000 });

/**
 * One round trip to PostgreSQL for `limits.length` requests of one key. Every request of a key
 * updates the same counter row, so its commit skips the wait for the WAL flush
 * (synchronous_commit off for this statement only): the row lock is released at once, and a
 * crash can at worst forget the last few counts.
 */
async function countUses(keyHash: string, limits: number[]): Promise<KeyUse[]> {
	const calls = limits.length;
	const [row] = await db.execute<KeyRow>(sql`
		with key as (
			select k.id, k.workspace_id, k.scope, k.created_by, k.revoked_at,
				w.name as workspace_name, w.subscription_status, w.trial_ends_at
			from api_keys k join workspaces w on w.id = k.workspace_id
			where k.key_hash = ${keyHash}
		),
		counted as (
			insert into api_request_counts (key_id, minute, count)
			select id, date_trunc('minute', now()), ${calls} from key where revoked_at is null
			on conflict (key_id, minute) do update set count = api_request_counts.count + excluded.count
			returning count, xmax = 0 as fresh,
				extract(epoch from minute + interval '1 minute' - now()) as seconds_left
		),
		touched as (
			update api_keys set last_used_at = now()
			where id = (select id from key where revoked_at is null)
				and (last_used_at is null or last_used_at < now() - interval '1 minute')
		)
		select key.id, key.workspace_id, key.scope, key.created_by,
			key.workspace_name, key.subscription_status, key.trial_ends_at,
			key.revoked_at is not null as revoked, counted.count, counted.fresh, counted.seconds_left,
			(select set_config('synchronous_commit', 'off', true)) as async_commit
		from key left join counted on true
	`);
	if (!row) return limits.map(() => ({ status: 'unknown' }));
	if (row.revoked) return limits.map(() => ({ status: 'revoked' }));
	if (row.fresh) void forgetOldWindows(row.id);
	const first = Number(row.count) - calls + 1;
	const standing = {
		name: row.workspace_name,
		subscriptionStatus: row.subscription_status,
		trialEndsAt: row.trial_ends_at === null ? null : new Date(row.trial_ends_at)
	};
	const retryAfter = Math.max(1, Math.ceil(Number(row.seconds_left)));
	return limits.map((limit, i) => ({
		status: first + i > limit ? 'limited' : 'allowed',
		keyId: row.id,
		workspaceId: row.workspace_id,
		standing,
		scope: row.scope,
		actorId: row.created_by,
		count: first + i,
		retryAfter
	}));
}

/** Drops a key's finished windows older than a day; runs when a new window opens. */
async function forgetOldWindows(keyId: string) {
	await db
		.execute(
			sql`delete from api_request_counts where key_id = ${keyId} and minute < now() - interval '1 day'`
		)
		.catch((err) => console.error('[pincer] could not prune api_request_counts:', err));
}
