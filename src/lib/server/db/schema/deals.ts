import { sql } from 'drizzle-orm';
import {
	customType,
	index,
	integer,
	jsonb,
	pgTable,
	text,
	timestamp,
	unique,
	uuid
} from 'drizzle-orm/pg-core';
import { solves } from './solves';
import { users } from './users';
import { workspaces } from './workspaces';

const bytea = customType<{ data: Buffer }>({ dataType: () => 'bytea' });

/** A deal (or a scenario of one: `scenarioOf` points at the base deal). Flows live in versions. */
export const deals = pgTable(
	'deals',
	{
		id: uuid().primaryKey().defaultRandom(),
		workspaceId: uuid()
			.notNull()
			.references(() => workspaces.id, { onDelete: 'cascade' }),
		name: text().notNull(),
		scenarioOf: uuid(),
		currentVersion: integer().notNull().default(1),
		lastSolveId: uuid().references(() => solves.id, { onDelete: 'set null' }),
		lastSolvedAt: timestamp({ withTimezone: true }),
		ownerId: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('deals_workspace_updated_idx').on(t.workspaceId, t.updatedAt),
		index('deals_scenario_idx').on(t.scenarioOf)
	]
);

/** Immutable versions of a deal's flows and settings (decimal strings in JSON). */
export const dealVersions = pgTable(
	'deal_versions',
	{
		id: uuid().primaryKey().defaultRandom(),
		dealId: uuid()
			.notNull()
			.references(() => deals.id, { onDelete: 'cascade' }),
		version: integer().notNull(),
		/** { mode, frequency, dayCount, hurdleRate, financeRate, reinvestRate, flows: [...] } */
		content: jsonb().$type<Record<string, unknown>>().notNull(),
		changes: jsonb()
			.$type<string[]>()
			.notNull()
			.default(sql`'[]'::jsonb`),
		createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [unique('deal_versions_deal_version_key').on(t.dealId, t.version)]
);

/** The original uploaded file of a deal, kept byte for byte. */
export const dealFiles = pgTable(
	'deal_files',
	{
		id: uuid().primaryKey().defaultRandom(),
		dealId: uuid()
			.notNull()
			.references(() => deals.id, { onDelete: 'cascade' }),
		version: integer().notNull(),
		fileName: text().notNull(),
		contentType: text().notNull(),
		size: integer().notNull(),
		bytes: bytea().notNull(),
		uploadedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('deal_files_deal_idx').on(t.dealId)]
);
