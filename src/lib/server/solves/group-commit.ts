// Group commit for solves asked for on their own (POST /api/v1/solve). Each workspace's audit
// chain takes one append at a time, so one transaction per call made every call wait its turn
// for the chain's lock, and the lock was held across several round trips. Here a workspace has
// at most one writing transaction per process: calls that arrive while it runs wait for the
// next one, which stores all of them (solve rows and their solve.run events, chained in arrival
// order) and commits once. A call is answered only after the transaction holding its solve and
// its audit event has committed, exactly as before; an idle server writes a lone call at once.
import { db } from '../db';
import { recordSolves, type SolveRecord } from './index';

/** Most solves one transaction stores (bounds the statement size: about 15 kB a loan request). */
export const MAX_BATCH = 64;

type Waiting = {
	record: SolveRecord;
	resolve: (id: string) => void;
	reject: (err: unknown) => void;
};

/** Per workspace, the calls waiting for the next transaction; present while one is running. */
const queues = new Map<string, Waiting[]>();

/** Stores a solved record (solve row and solve.run event, one transaction); its id once committed. */
export function storeSolve(record: SolveRecord): Promise<string> {
	return new Promise((resolve, reject) => {
		const workspaceId = record.acting.workspaceId;
		const waiting = queues.get(workspaceId);
		if (waiting) {
			waiting.push({ record, resolve, reject });
			return;
		}
		const queue = [{ record, resolve, reject }];
		queues.set(workspaceId, queue);
		void writeWhileWaiting(workspaceId, queue);
	});
}

async function writeWhileWaiting(workspaceId: string, queue: Waiting[]) {
	try {
		while (queue.length > 0) await write(workspaceId, queue.splice(0, MAX_BATCH));
	} finally {
		queues.delete(workspaceId);
	}
}

/** SQLSTATE classes of errors caused by the data of a row (22 data exception, 23 constraint). */
const DATA_ERROR = /^2[23]/;

async function write(workspaceId: string, batch: Waiting[]): Promise<void> {
	try {
		const ids = await db.transaction((tx) =>
			recordSolves(
				tx,
				workspaceId,
				batch.map((w) => w.record)
			)
		);
		batch.forEach((w, i) => w.resolve(ids[i]));
	} catch (err) {
		const code = (err as { code?: unknown; cause?: { code?: unknown } }).cause?.code;
		const sqlState = typeof code === 'string' ? code : String((err as { code?: unknown }).code);
		if (batch.length > 1 && DATA_ERROR.test(sqlState)) {
			// One record the database refuses must not fail the calls that came with it.
			for (const waiting of batch) await write(workspaceId, [waiting]);
			return;
		}
		for (const waiting of batch) waiting.reject(err);
	}
}
