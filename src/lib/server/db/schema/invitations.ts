import { index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users } from './users';
import { roleEnum, workspaces } from './workspaces';

/** An invitation to join a workspace with a role: single-use token (SHA-256 stored), 7 days. */
export const invitations = pgTable(
	'invitations',
	{
		id: uuid().primaryKey().defaultRandom(),
		workspaceId: uuid()
			.notNull()
			.references(() => workspaces.id, { onDelete: 'cascade' }),
		email: text().notNull(),
		role: roleEnum().notNull(),
		tokenHash: text().notNull().unique(),
		invitedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
		expiresAt: timestamp({ withTimezone: true }).notNull(),
		acceptedAt: timestamp({ withTimezone: true }),
		acceptedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
		revokedAt: timestamp({ withTimezone: true }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('invitations_workspace_idx').on(t.workspaceId, t.createdAt)]
);
