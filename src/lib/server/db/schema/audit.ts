import { bigint, index, jsonb, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './users';
import { workspaces } from './workspaces';

// Append-only: a trigger (see the custom migration) rejects UPDATE and DELETE.
export const auditEvents = pgTable(
	'audit_events',
	{
		id: bigint({ mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
		workspaceId: uuid().references(() => workspaces.id, { onDelete: 'restrict' }),
		actorId: uuid().references(() => users.id, { onDelete: 'restrict' }),
		/** What happened, as `domain.verb`, e.g. `loan.create`, `auth.signin`. */
		action: text().notNull(),
		/** What it happened to, as `type:id`, e.g. `loan:3f1c…`. */
		subject: text(),
		payload: jsonb().$type<Record<string, unknown>>().notNull().default({}),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		/** Hash of the previous event in the same workspace's chain (hex SHA-256), '' for the first. */
		prevHash: text(),
		/** SHA-256 over prevHash and this event's canonical content (see audit/chain.ts). */
		hash: text()
	},
	(t) => [
		index('audit_events_workspace_idx').on(t.workspaceId, t.id),
		index('audit_events_actor_idx').on(t.actorId)
	]
);
