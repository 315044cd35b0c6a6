import { requireApiCaller } from '$lib/server/auth';
import { apiCall, ok } from '$lib/server/api/call';
import { dealPage, saveDeal } from '$lib/server/api/deals';
import { endpoints } from '$lib/server/api/endpoints';
import { readJson, readQuery } from '$lib/server/api/input';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = (event) =>
	apiCall(event, async () => {
		const route = endpoints.listDeals;
		const caller = await requireApiCaller(event, ...route.roles);
		return ok(await dealPage(caller.workspaceId, readQuery(event.url, route.query)));
	});

export const POST: RequestHandler = (event) =>
	apiCall(event, async () => {
		const route = endpoints.createDeal;
		const caller = await requireApiCaller(event, ...route.roles);
		const input = await readJson(event.request, route.body.schema);
		const deal = await saveDeal(caller, null, input);
		return ok(deal, 201, { location: `/api/v1/deals/${deal.id}` });
	});
