import { requireApiCaller } from '$lib/server/auth';
import { apiCall, ok } from '$lib/server/api/call';
import { dealById, saveDeal } from '$lib/server/api/deals';
import { endpoints } from '$lib/server/api/endpoints';
import { pathId, readJson, readQuery } from '$lib/server/api/input';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = (event) =>
	apiCall(event, async () => {
		const route = endpoints.getDeal;
		const caller = await requireApiCaller(event, ...route.roles);
		const dealId = pathId(event.params.dealId);
		const { version } = readQuery(event.url, route.query);
		return ok(await dealById(caller.workspaceId, dealId, version));
	});

export const PUT: RequestHandler = (event) =>
	apiCall(event, async () => {
		const route = endpoints.updateDeal;
		const caller = await requireApiCaller(event, ...route.roles);
		const dealId = pathId(event.params.dealId);
		const input = await readJson(event.request, route.body.schema);
		return ok(await saveDeal(caller, dealId, input));
	});
