// The audit trail's hash chain. Each workspace (and the workspace-less "global" stream) is one
// chain: an event's hash is SHA-256 over the previous event's hash and the event's canonical
// content, so editing or deleting any row breaks every hash after it. Appends are serialised
// per chain with a transaction-scoped advisory lock. No $env or framework imports: the seed
// script uses this module too.
import { createHash } from 'node:crypto';
import { and, asc, eq, gt, isNull, sql, type SQLWrapper } from 'drizzle-orm';
import { auditEvents } from '../db/schema/audit';
import type { Executor } from '../db/types';

export type AuditInput = {
	workspaceId: string | null;
	actorId: string | null;
	/** `domain.verb`, e.g. `auth.signin`, `member.invite`, `loan.update`. */
	action: string;
	/** `type:id` of what the event is about. */
	subject?: string | null;
	payload?: Record<string, unknown>;
};

type ChainedContent = Required<AuditInput> & { createdAt: Date };

/** JSON with object keys sorted at every depth, so equal content always hashes the same. */
export function canonicalJson(value: unknown): string {
	if (value === null || typeof value !== 'object') return JSON.stringify(value ?? null);
	if (value instanceof Date) return JSON.stringify(value.toISOString());
	if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
	const entries = Object.entries(value as Record<string, unknown>)
		.filter(([, v]) => v !== undefined)
		.sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
	return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

/** The canonical JSON an event's hash covers (besides the previous event's hash). */
export function eventContent(event: ChainedContent): string {
	return canonicalJson({
		workspaceId: event.workspaceId,
		actorId: event.actorId,
		action: event.action,
		subject: event.subject,
		payload: event.payload,
		createdAt: event.createdAt.toISOString()
	});
}

/** hex(SHA-256(prevHash, newline, content)); the audit_append function computes the same. */
export function eventHash(prevHash: string, event: ChainedContent): string {
	return createHash('sha256')
		.update(`${prevHash}\n${eventContent(event)}`)
		.digest('hex');
}

const chainOf = (workspaceId: string | null) =>
	workspaceId === null ? isNull(auditEvents.workspaceId) : eq(auditEvents.workspaceId, workspaceId);

/** Appends one event to its workspace's chain. Call inside the transaction of the change it records. */
export async function appendAuditEvent(
	tx: Executor,
	input: AuditInput
): Promise<{ id: number; hash: string }> {
	const [appended] = await appendAuditEvents(tx, input.workspaceId, [input]);
	return appended;
}

/**
 * Appends events of one chain, in the order given, in one round trip: the audit_append function
 * (migration 0005) takes the chain's lock, reads its last hash and inserts the events hashed on
 * from it. Call inside the transaction of the changes they record; the lock is held until it ends.
 */
export async function appendAuditEvents(
	tx: Executor,
	workspaceId: string | null,
	inputs: AuditInput[],
	/** A change to make in the same statement (a data-modifying WITH), e.g. the rows audited. */
	alongside?: SQLWrapper
): Promise<{ id: number; hash: string }[]> {
	if (inputs.some((input) => input.workspaceId !== workspaceId)) {
		throw new Error('appendAuditEvents: every event must belong to the chain it is appended to');
	}
	if (inputs.length === 0) return [];
	const createdAt = new Date();
	const events = inputs.map((input) => {
		const event: ChainedContent = {
			workspaceId,
			actorId: input.actorId,
			action: input.action,
			subject: input.subject ?? null,
			payload: input.payload ?? {},
			createdAt
		};
		return { ...event, createdAt: createdAt.toISOString(), content: eventContent(event) };
	});
	const append = sql`select event_id, event_hash from audit_append(${workspaceId}::uuid, ${JSON.stringify(events)}::jsonb)`;
	const rows = await tx.execute<{ event_id: string; event_hash: string }>(
		alongside ? sql`with alongside as ${alongside} ${append}` : append
	);
	return [...rows].map((row) => ({ id: Number(row.event_id), hash: row.event_hash }));
}

export type ChainCheck =
	| { intact: true; events: number }
	| { intact: false; events: number; brokenAt: { id: number; action: string; reason: string } };

/** Recomputes a workspace's chain from its first event; reports the first event that fails. */
export async function checkChain(db: Executor, workspaceId: string | null): Promise<ChainCheck> {
	let prevHash = '';
	let events = 0;
	let afterId = 0;
	for (;;) {
		const batch = await db
			.select()
			.from(auditEvents)
			.where(and(chainOf(workspaceId), gt(auditEvents.id, afterId)))
			.orderBy(asc(auditEvents.id))
			.limit(2000);
		if (batch.length === 0) return { intact: true, events };
		for (const row of batch) {
			events++;
			if ((row.prevHash ?? '') !== prevHash) {
				return {
					intact: false,
					events,
					brokenAt: {
						id: row.id,
						action: row.action,
						reason: 'the event before it is missing or was changed'
					}
				};
			}
			const expected = eventHash(prevHash, {
				workspaceId: row.workspaceId,
				actorId: row.actorId,
				action: row.action,
				subject: row.subject,
				payload: row.payload,
				createdAt: row.createdAt
			});
			if (expected !== row.hash) {
				return {
					intact: false,
					events,
					brokenAt: {
						id: row.id,
						action: row.action,
						reason: 'its content no longer matches its hash'
					}
				};
			}
			prevHash = row.hash;
			afterId = row.id;
		}
	}
}
