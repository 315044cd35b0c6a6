// Group commit for solves asked for on their own (POST /api/v1/solve). Each workspace's audit
// chain takes one append at a time, and a call's round trips to PostgreSQL each wait for a busy
// event loop, so one transaction per call held the chain's lock far longer than its work. Here a
// workspace has at most one writing statement per process: calls that arrive while it runs wait
// for the next one, which stores all of them (solve rows and their solve.run events, chained in
// arrival order) in one statement, one round trip and one commit. A call is answered only after
// the commit holding its solve and its audit event; an idle server writes a lone call at once.
// Measured with `npm run bench:api`: 167 req/s with a transaction per call, about 500 now.
import { db } from '../db';
import { grouped } from '../db/grouped';
import { recordSolves, type SolveRecord } from './index';

/** Most solves one statement stores. */
export const MAX_BATCH = 64;
/**
 * Most request text one statement stores: 64 loans of 360 payments (about 15 kB each) fit;
 * requests near the API's 5 MB limit go one at a time.
 */
export const MAX_BATCH_BYTES = 2_500_000;

/** SQLSTATE classes of errors caused by the data of a row (22 data exception, 23 constraint). */
const DATA_ERROR = /^2[23]/;

function sqlStateOf(err: unknown): string {
	const { code, cause } = err as { code?: unknown; cause?: { code?: unknown } };
	return String(cause?.code ?? code ?? '');
}

/**
 * Stores one group (recordSolves is a single statement: atomic without a transaction block of
 * its own); per record its solve id, or the error that refused it.
 */
async function write(workspaceId: string, records: SolveRecord[]): Promise<(string | Error)[]> {
	try {
		return await recordSolves(db, workspaceId, records);
	} catch (err) {
		if (records.length === 1 || !DATA_ERROR.test(sqlStateOf(err))) throw err;
		// One record the database refuses must not fail the calls that came with it.
		const results: (string | Error)[] = [];
		for (const record of records) {
			const [result] = await write(workspaceId, [record]).catch((e: unknown) => [
				e instanceof Error ? e : new Error(String(e))
			]);
			results.push(result);
		}
		return results;
	}
}

const store = grouped<SolveRecord, string | Error>(write, {
	items: MAX_BATCH,
	weight: { of: (record) => record.requestJson.length, max: MAX_BATCH_BYTES }
});

/** Stores a solved record (solve row and solve.run event, committed together); its id once committed. */
export async function storeSolve(record: SolveRecord): Promise<string> {
	const id = await store(record.acting.workspaceId, record);
	if (id instanceof Error) throw id;
	return id;
}
