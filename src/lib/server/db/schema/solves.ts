import {
	index,
	integer,
	json,
	jsonb,
	numeric,
	pgTable,
	text,
	timestamp,
	uuid
} from 'drizzle-orm/pg-core';
import { users } from './users';
import { workspaces } from './workspaces';

/**
 * Every solve Pincer has run: the exact request (inputs snapshot), the engine's result, the
 * engine version, who and when. Loans, deals and API calls all write here.
 */
export const solves = pgTable(
	'solves',
	{
		id: uuid().primaryKey().defaultRandom(),
		workspaceId: uuid()
			.notNull()
			.references(() => workspaces.id, { onDelete: 'cascade' }),
		/** loan | deal | api */
		subjectType: text().notNull(),
		subjectId: uuid(),
		subjectVersion: integer(),
		kind: text().notNull(),
		status: text().notNull(),
		/** Headline rate as a fraction (unit per `kind`), null unless exactly one root. */
		rate: numeric({ precision: 60, scale: 40 }),
		/**
		 * json, not jsonb: stored and read back whole, never queried inside, and PostgreSQL takes
		 * json text in about a quarter of jsonb's time (a 30-year loan is about 15 kB).
		 */
		request: json().$type<Record<string, unknown>>().notNull(),
		result: jsonb().$type<Record<string, unknown>>().notNull(),
		engineVersion: text().notNull(),
		createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('solves_subject_idx').on(t.subjectType, t.subjectId, t.createdAt),
		index('solves_workspace_idx').on(t.workspaceId, t.createdAt)
	]
);
