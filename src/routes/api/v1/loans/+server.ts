import { requireApiCaller } from '$lib/server/auth';
import { apiCall, ok } from '$lib/server/api/call';
import { endpoints } from '$lib/server/api/endpoints';
import { readJson, readQuery } from '$lib/server/api/input';
import { loanPage, saveLoan } from '$lib/server/api/loans';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = (event) =>
	apiCall(event, async () => {
		const route = endpoints.listLoans;
		const caller = await requireApiCaller(event, ...route.roles);
		return ok(await loanPage(caller.workspaceId, readQuery(event.url, route.query)));
	});

export const POST: RequestHandler = (event) =>
	apiCall(event, async () => {
		const route = endpoints.createLoan;
		const caller = await requireApiCaller(event, ...route.roles);
		const input = await readJson(event.request, route.body.schema);
		const loan = await saveLoan(caller, null, input);
		return ok(loan, 201, { location: `/api/v1/loans/${loan.id}` });
	});
