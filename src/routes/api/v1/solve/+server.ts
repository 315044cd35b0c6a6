import { requireApiCaller } from '$lib/server/auth';
import { apiCall, ok } from '$lib/server/api/call';
import { endpoints } from '$lib/server/api/endpoints';
import { readJsonText } from '$lib/server/api/input';
import { solveForCaller } from '$lib/server/api/solves';
import type { RequestHandler } from './$types';

const route = endpoints.solve;

// solve.run, written with the stored solve, is the audit record of a successful call.
export const POST: RequestHandler = (event) =>
	apiCall(
		event,
		async () => {
			const caller = await requireApiCaller(event, ...route.roles);
			return ok(await solveForCaller(caller, await readJsonText(event.request, route.body.schema)));
		},
		{ auditedOnSuccess: true }
	);
