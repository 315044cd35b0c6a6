// Solves through the API: POST /solve runs and stores the engine like the screens do, with the
// key that asked as the solve's subject; GET /solves/{id} reads any solve of the workspace.
import type { SolveRequest } from '$lib/schemas/solve';
import type { ApiCaller } from '../auth/api-keys';
import { db } from '../db';
import { getSolve, solveAndRecord } from '../solves';
import { notFound } from './input';
import { presentSolve } from './present';

/** Runs, stores and audits (solve.run) one solve in one transaction; the result with its id. */
export async function solveForCaller(caller: ApiCaller, request: SolveRequest) {
	const { id, result } = await db.transaction((tx) =>
		solveAndRecord(tx, caller, { type: 'api', id: caller.keyId }, request)
	);
	return { id, ...result };
}

export async function solveById(workspaceId: string, solveId: string) {
	const row = await getSolve(workspaceId, solveId);
	if (!row) throw notFound();
	return presentSolve(row);
}
