import { sql } from 'drizzle-orm';
import {
	integer,
	pgEnum,
	pgTable,
	text,
	timestamp,
	unique,
	uuid,
	index
} from 'drizzle-orm/pg-core';
import { users } from './users';

export const roles = ['admin', 'officer', 'analyst', 'reviewer'] as const;
export type Role = (typeof roles)[number];
export const roleEnum = pgEnum('role', roles);

export const workspaces = pgTable('workspaces', {
	id: uuid().primaryKey().defaultRandom(),
	name: text().notNull(),
	slug: text().notNull().unique(),
	/** Seats paid for (or granted by the trial); active members never exceed it. */
	seats: integer().notNull().default(3),
	/** trialing | active | past_due | canceled | unpaid | incomplete (the payment provider's words). */
	subscriptionStatus: text().notNull().default('trialing'),
	trialEndsAt: timestamp({ withTimezone: true }),
	stripeCustomerId: text(),
	stripeSubscriptionId: text(),
	currentPeriodEnd: timestamp({ withTimezone: true }),
	createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
	updatedAt: timestamp({ withTimezone: true }).notNull().defaultNow()
});

export const memberships = pgTable(
	'memberships',
	{
		id: uuid().primaryKey().defaultRandom(),
		workspaceId: uuid()
			.notNull()
			.references(() => workspaces.id, { onDelete: 'cascade' }),
		userId: uuid()
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		role: roleEnum().notNull(),
		createdAt: timestamp({ withTimezone: true })
			.notNull()
			.default(sql`now()`)
	},
	(t) => [
		unique('memberships_workspace_user_key').on(t.workspaceId, t.userId),
		index('memberships_user_idx').on(t.userId)
	]
);
