// Applies the committed Drizzle migrations in drizzle/ to DATABASE_URL. Idempotent.
import { drizzle } from 'drizzle-orm/postgres-js';
import { migrate } from 'drizzle-orm/postgres-js/migrator';
import postgres from 'postgres';

const url = process.env.DATABASE_URL;
if (!url) {
	console.error('[pincer] DATABASE_URL is not set');
	process.exit(1);
}
const client = postgres(url, { max: 1, onnotice: () => {} });
try {
	await migrate(drizzle(client), {
		migrationsFolder: new URL('../drizzle', import.meta.url).pathname
	});
	console.error('[pincer] migrations applied');
} catch (err) {
	const cause = (err as { cause?: { message?: string } }).cause?.message;
	console.error(`[pincer] migration failed: ${cause ?? (err as Error).message}`);
	process.exitCode = 1;
} finally {
	await client.end();
}
