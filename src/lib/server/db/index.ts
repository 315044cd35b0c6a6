import { building } from '$app/environment';
import { env } from '$env/dynamic/private';
import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import * as schema from './schema';

function connect() {
	const url = env.DATABASE_URL;
	// `vite build` imports server modules to analyse them; it needs no database.
	if (!url && !building) throw new Error('DATABASE_URL is not set (see .env.example)');
	const client = postgres(url ?? 'postgres://build-time-placeholder/none', {
		max: Number(env.DATABASE_POOL_SIZE ?? 10),
		onnotice: () => {},
		connect_timeout: 5
	});
	return { client, db: drizzle(client, { schema, casing: 'snake_case' }) };
}

const connection = connect();

/** The shared postgres.js pool; closed on shutdown so `node build` exits promptly. */
export const sqlClient = connection.client;
/** Drizzle over the pool; numeric columns come back as strings (feed them to decimal.js). */
export const db = connection.db;
export type Database = typeof db;
export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];

if (!building) {
	process.on('sveltekit:shutdown', async () => {
		await sqlClient.end({ timeout: 5 });
	});
}
