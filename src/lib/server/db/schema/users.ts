import { pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

// Shaped for the Auth.js Drizzle adapter (id, name, email, emailVerified, image) plus our own columns.
export const users = pgTable('users', {
	id: uuid().primaryKey().defaultRandom(),
	name: text(),
	email: text().notNull().unique(),
	emailVerified: timestamp({ withTimezone: true, mode: 'date' }),
	image: text(),
	/** argon2id hash; null for accounts that only sign in by e-mailed link. */
	passwordHash: text(),
	createdAt: timestamp({ withTimezone: true }).notNull().defaultNow()
});
