import { sql } from 'drizzle-orm';
import {
	boolean,
	index,
	integer,
	jsonb,
	numeric,
	pgTable,
	text,
	timestamp,
	unique,
	uuid
} from 'drizzle-orm/pg-core';
import { solves } from './solves';
import { users } from './users';
import { workspaces } from './workspaces';

/** A loan file. Its terms live in versions; the loan row points at the current one. */
export const loans = pgTable(
	'loans',
	{
		id: uuid().primaryKey().defaultRandom(),
		workspaceId: uuid()
			.notNull()
			.references(() => workspaces.id, { onDelete: 'cascade' }),
		reference: text().notNull(),
		borrowerName: text().notNull(),
		/** us-apr | eu-aprc */
		regime: text().notNull(),
		/** draft | disclosed */
		status: text().notNull().default('draft'),
		currentVersion: integer().notNull().default(1),
		disclosedVersion: integer(),
		createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
		updatedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
		updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		unique('loans_workspace_reference_key').on(t.workspaceId, t.reference),
		index('loans_workspace_updated_idx').on(t.workspaceId, t.updatedAt)
	]
);

/** Immutable versions of a loan's terms and the figures computed from them. */
export const loanVersions = pgTable(
	'loan_versions',
	{
		id: uuid().primaryKey().defaultRandom(),
		loanId: uuid()
			.notNull()
			.references(() => loans.id, { onDelete: 'cascade' }),
		version: integer().notNull(),
		/** terms | schedule */
		entryMode: text().notNull(),
		/** The Terms form as entered (decimal strings), or the entered schedule rows. */
		terms: jsonb().$type<Record<string, unknown>>().notNull(),
		amountFinanced: numeric({ precision: 18, scale: 2 }).notNull(),
		financeCharge: numeric({ precision: 18, scale: 2 }).notNull(),
		totalOfPayments: numeric({ precision: 18, scale: 2 }).notNull(),
		solveId: uuid().references(() => solves.id, { onDelete: 'set null' }),
		/** A short list of what changed from the previous version. */
		changes: jsonb()
			.$type<string[]>()
			.notNull()
			.default(sql`'[]'::jsonb`),
		createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [unique('loan_versions_loan_version_key').on(t.loanId, t.version)]
);

/** An officer's check of a disclosed APR (and finance charge) against 1026.22 and 1026.18(d). */
export const toleranceChecks = pgTable(
	'tolerance_checks',
	{
		id: uuid().primaryKey().defaultRandom(),
		workspaceId: uuid()
			.notNull()
			.references(() => workspaces.id, { onDelete: 'cascade' }),
		loanId: uuid()
			.notNull()
			.references(() => loans.id, { onDelete: 'cascade' }),
		version: integer().notNull(),
		solveId: uuid().references(() => solves.id, { onDelete: 'set null' }),
		disclosedApr: numeric({ precision: 12, scale: 6 }).notNull(),
		aprAccurate: boolean().notNull(),
		disclosedFinanceCharge: numeric({ precision: 18, scale: 2 }),
		financeChargeAccurate: boolean(),
		securedByRealProperty: boolean().notNull().default(false),
		detail: jsonb().$type<Record<string, unknown>>().notNull(),
		resolvedAt: timestamp({ withTimezone: true }),
		resolvedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('tolerance_checks_open_idx').on(t.workspaceId, t.resolvedAt)]
);
