// Solves through the API: POST /solve runs and stores the engine like the screens do, with the
// key that asked as the solve's subject; GET /solves/{id} reads any solve of the workspace.
import type { SolveRequest } from '$lib/schemas/solve';
import type { ApiCaller } from '../auth/api-keys';
import { getSolve } from '../solves';
import { storeSolve } from '../solves/group-commit';
import { solve } from '../solver';
import { notFound } from './input';
import { presentSolve } from './present';

/**
 * Runs the engine, then stores the solve with its solve.run event (committed together, in a
 * group commit with the workspace's other calls of the moment); the result with its id.
 * `requestJson` is the body as received, stored as it is: the parsed request is not kept while
 * the call waits for its commit.
 */
export async function solveForCaller(
	caller: ApiCaller,
	{ value: request, text: requestJson }: { value: SolveRequest; text: string }
) {
	const result = solve(request);
	const id = await storeSolve({
		acting: caller,
		subject: { type: 'api', id: caller.keyId },
		kind: request.kind,
		requestJson,
		result
	});
	return { id, ...result };
}

export async function solveById(workspaceId: string, solveId: string) {
	const row = await getSolve(workspaceId, solveId);
	if (!row) throw notFound();
	return presentSolve(row);
}
