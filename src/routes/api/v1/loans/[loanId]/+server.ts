import { requireApiCaller } from '$lib/server/auth';
import { apiCall, ok } from '$lib/server/api/call';
import { endpoints } from '$lib/server/api/endpoints';
import { pathId, readJson, readQuery } from '$lib/server/api/input';
import { loanById, saveLoan } from '$lib/server/api/loans';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = (event) =>
	apiCall(event, async () => {
		const route = endpoints.getLoan;
		const caller = await requireApiCaller(event, ...route.roles);
		const loanId = pathId(event.params.loanId);
		const { version } = readQuery(event.url, route.query);
		return ok(await loanById(caller.workspaceId, loanId, version));
	});

export const PUT: RequestHandler = (event) =>
	apiCall(event, async () => {
		const route = endpoints.updateLoan;
		const caller = await requireApiCaller(event, ...route.roles);
		const loanId = pathId(event.params.loanId);
		const input = await readJson(event.request, route.body.schema);
		return ok(await saveLoan(caller, loanId, input));
	});
