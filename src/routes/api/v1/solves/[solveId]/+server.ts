import { requireApiCaller } from '$lib/server/auth';
import { apiCall, ok } from '$lib/server/api/call';
import { endpoints } from '$lib/server/api/endpoints';
import { pathId } from '$lib/server/api/input';
import { solveById } from '$lib/server/api/solves';
import type { RequestHandler } from './$types';

const route = endpoints.getSolve;

export const GET: RequestHandler = (event) =>
	apiCall(event, async () => {
		const caller = await requireApiCaller(event, ...route.roles);
		return ok(await solveById(caller.workspaceId, pathId(event.params.solveId)));
	});
