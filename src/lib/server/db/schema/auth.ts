import {
	index,
	integer,
	pgTable,
	primaryKey,
	text,
	timestamp,
	uuid,
	boolean,
	inet
} from 'drizzle-orm/pg-core';
import { users } from './users';

// Tables the Auth.js Drizzle adapter expects (accounts, verification tokens), in our naming.
export const accounts = pgTable(
	'accounts',
	{
		userId: uuid()
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		type: text().$type<'email' | 'oauth' | 'oidc' | 'webauthn'>().notNull(),
		provider: text().notNull(),
		providerAccountId: text().notNull(),
		refresh_token: text(),
		access_token: text(),
		expires_at: integer(),
		token_type: text(),
		scope: text(),
		id_token: text(),
		session_state: text()
	},
	(t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })]
);

/** One-time sign-in links; Auth.js stores only a hash of each token. */
export const verificationTokens = pgTable(
	'verification_tokens',
	{
		identifier: text().notNull(),
		token: text().notNull(),
		expires: timestamp({ mode: 'date', withTimezone: true }).notNull()
	},
	(t) => [primaryKey({ columns: [t.identifier, t.token] })]
);

/** Single-use password reset links (SHA-256 of the token; valid 30 minutes). */
export const passwordResets = pgTable(
	'password_resets',
	{
		id: uuid().primaryKey().defaultRandom(),
		userId: uuid()
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		tokenHash: text().notNull().unique(),
		expiresAt: timestamp({ withTimezone: true }).notNull(),
		usedAt: timestamp({ withTimezone: true }),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('password_resets_user_idx').on(t.userId)]
);

/**
 * Attempts at sign-in and at sending links, counted in PostgreSQL so that the limit holds
 * across server processes. `kind`: password | link | reset.
 */
export const authAttempts = pgTable(
	'auth_attempts',
	{
		id: uuid().primaryKey().defaultRandom(),
		kind: text().$type<'password' | 'link' | 'reset'>().notNull(),
		email: text().notNull(),
		ip: inet(),
		succeeded: boolean().notNull(),
		createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('auth_attempts_email_idx').on(t.email, t.createdAt),
		index('auth_attempts_ip_idx').on(t.ip, t.createdAt)
	]
);
