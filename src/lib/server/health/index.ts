import journal from '../../../../drizzle/meta/_journal.json';
import { sqlClient } from '../db';

export type Health = {
	status: 'ok' | 'unavailable';
	version: string;
	database: { reachable: boolean; latencyMs?: number; error?: string };
	migrations: { expected: number; applied: number | null; pending: boolean | null };
};

/** Database reachability and migration state, as served by GET /healthz. */
export async function checkHealth(): Promise<Health> {
	const expected = journal.entries.length;
	const lastExpected = journal.entries.at(-1)?.when ?? 0;
	const started = performance.now();
	try {
		const rows = await sqlClient<{ applied: number; last: string | null }[]>`
			select count(*)::int as applied, max(created_at)::text as last
			from drizzle.__drizzle_migrations`.catch(async (err: { code?: string }) => {
			if (err.code === '3F000' || err.code === '42P01') return [{ applied: 0, last: null }];
			throw err;
		});
		const latencyMs = Math.round((performance.now() - started) * 10) / 10;
		const { applied, last } = rows[0];
		const pending = applied < expected || Number(last ?? 0) < lastExpected;
		return {
			status: pending ? 'unavailable' : 'ok',
			version: __PINCER_VERSION__,
			database: { reachable: true, latencyMs },
			migrations: { expected, applied, pending }
		};
	} catch (err) {
		return {
			status: 'unavailable',
			version: __PINCER_VERSION__,
			database: { reachable: false, error: (err as Error).message },
			migrations: { expected, applied: null, pending: null }
		};
	}
}
