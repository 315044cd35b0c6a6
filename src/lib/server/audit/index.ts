import { and, count, desc, eq, gte, ilike, lt, or, sql, type SQL } from 'drizzle-orm';
import type { AuditFilter } from '$lib/schemas/audit';
import { db } from '../db';
import { auditEvents, users } from '../db/schema';
import { appendAuditEvent, checkChain, type AuditInput } from './chain';

export { appendAuditEvent, checkChain };
export type { AuditInput };

export const PAGE_SIZE = 50;

function conditions(workspaceId: string, filter: Omit<AuditFilter, 'page'>): SQL | undefined {
	const parts: (SQL | undefined)[] = [eq(auditEvents.workspaceId, workspaceId)];
	if (filter.who) {
		const like = `%${filter.who.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
		parts.push(or(ilike(users.email, like), ilike(users.name, like)));
	}
	if (filter.what)
		parts.push(ilike(auditEvents.action, `${filter.what.replace(/[\\%_]/g, (c) => `\\${c}`)}%`));
	if (filter.from) parts.push(gte(auditEvents.createdAt, new Date(`${filter.from}T00:00:00Z`)));
	if (filter.to)
		parts.push(
			lt(auditEvents.createdAt, sql`${`${filter.to}T00:00:00Z`}::timestamptz + interval '1 day'`)
		);
	return and(...parts);
}

const columns = {
	id: auditEvents.id,
	createdAt: auditEvents.createdAt,
	action: auditEvents.action,
	subject: auditEvents.subject,
	payload: auditEvents.payload,
	actorEmail: users.email,
	actorName: users.name,
	hash: auditEvents.hash
};

/** One page of a workspace's audit trail, newest first, with the total matching. */
export async function listAuditEvents(workspaceId: string, filter: AuditFilter) {
	const where = conditions(workspaceId, filter);
	const [rows, [{ total }]] = await Promise.all([
		db
			.select(columns)
			.from(auditEvents)
			.leftJoin(users, eq(users.id, auditEvents.actorId))
			.where(where)
			.orderBy(desc(auditEvents.id))
			.limit(PAGE_SIZE)
			.offset((filter.page - 1) * PAGE_SIZE),
		db
			.select({ total: count() })
			.from(auditEvents)
			.leftJoin(users, eq(users.id, auditEvents.actorId))
			.where(where)
	]);
	return { rows, total, pages: Math.max(1, Math.ceil(total / PAGE_SIZE)) };
}

/** Every matching event, oldest first, for export (capped so one export cannot exhaust memory). */
export async function allAuditEvents(
	workspaceId: string,
	filter: Omit<AuditFilter, 'page'>,
	cap = 100_000
) {
	return db
		.select(columns)
		.from(auditEvents)
		.leftJoin(users, eq(users.id, auditEvents.actorId))
		.where(conditions(workspaceId, filter))
		.orderBy(auditEvents.id)
		.limit(cap);
}
