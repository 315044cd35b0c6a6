import { index, integer, pgTable, text, timestamp, uuid, primaryKey } from 'drizzle-orm/pg-core';
import { users } from './users';
import { roleEnum, workspaces } from './workspaces';

/** Payment webhook events already processed: each event id has its effect once. */
export const webhookEvents = pgTable('webhook_events', {
	id: text().primaryKey(),
	type: text().notNull(),
	workspaceId: uuid().references(() => workspaces.id, { onDelete: 'set null' }),
	receivedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
});

/** API keys: only a SHA-256 of the key is kept; `prefix` lets people recognise a key. */
export const apiKeys = pgTable(
	'api_keys',
	{
		id: uuid().primaryKey().defaultRandom(),
		workspaceId: uuid()
			.notNull()
			.references(() => workspaces.id, { onDelete: 'cascade' }),
		name: text().notNull(),
		/** The role the key acts with: officer, analyst or reviewer. */
		scope: roleEnum().notNull(),
		prefix: text().notNull(),
		keyHash: text().notNull().unique(),
		createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		lastUsedAt: timestamp({ withTimezone: true }),
		revokedAt: timestamp({ withTimezone: true })
	},
	(t) => [index('api_keys_workspace_idx').on(t.workspaceId)]
);

/** Requests per API key per minute, counted in PostgreSQL so the limit holds across processes. */
export const apiRequestCounts = pgTable(
	'api_request_counts',
	{
		keyId: uuid()
			.notNull()
			.references(() => apiKeys.id, { onDelete: 'cascade' }),
		minute: timestamp({ withTimezone: true }).notNull(),
		count: integer().notNull().default(0)
	},
	(t) => [primaryKey({ columns: [t.keyId, t.minute] })]
);
