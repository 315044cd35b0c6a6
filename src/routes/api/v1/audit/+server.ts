import { requireApiCaller } from '$lib/server/auth';
import { auditPage } from '$lib/server/api/audit';
import { apiCall, ok } from '$lib/server/api/call';
import { endpoints } from '$lib/server/api/endpoints';
import { readQuery } from '$lib/server/api/input';
import type { RequestHandler } from './$types';

const route = endpoints.audit;

export const GET: RequestHandler = (event) =>
	apiCall(event, async () => {
		const caller = await requireApiCaller(event, ...route.roles);
		return ok(await auditPage(caller.workspaceId, readQuery(event.url, route.query)));
	});
