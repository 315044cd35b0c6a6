// Runs one API handler: answers whatever it throws as a JSON error and records the call in the
// workspace's audit trail as `api.call` (method, path, status, key). Calls whose caller is not
// known (no or unknown key) and calls refused by the rate limit are not recorded, so neither
// strangers nor a runaway client can grow a workspace's audit trail.
import { json, type RequestEvent } from '@sveltejs/kit';
import { appendAuditEvent } from '../audit/chain';
import { apiCallerOf } from '../auth/api-keys';
import { db } from '../db';
import { errorResponse, toApiError } from './errors';

type Options = {
	/** The handler's own service already audits a successful call (POST /solve: `solve.run`). */
	auditedOnSuccess?: boolean;
};

export async function apiCall(
	event: RequestEvent,
	handler: () => Promise<Response>,
	options: Options = {}
): Promise<Response> {
	const requestId = event.locals.requestId;
	const where = `${event.request.method} ${event.url.pathname}`;
	let response: Response;
	try {
		response = await handler();
	} catch (err) {
		response = errorResponse(toApiError(err, requestId, where), requestId);
	}
	const caller = apiCallerOf(event);
	const ok = response.status < 400;
	if (caller && response.status !== 429 && !(ok && options.auditedOnSuccess)) {
		try {
			await db.transaction((tx) =>
				appendAuditEvent(tx, {
					workspaceId: caller.workspaceId,
					actorId: caller.actorId,
					action: 'api.call',
					subject: caller.keyId ? `api_key:${caller.keyId}` : `user:${caller.actorId}`,
					payload: {
						method: event.request.method,
						path: event.url.pathname,
						query: event.url.search || undefined,
						status: response.status,
						via: caller.via,
						requestId
					}
				})
			);
		} catch (err) {
			// A read must not leave without its record; a write has its own event already.
			response = errorResponse(toApiError(err, requestId, `${where} (audit)`), requestId);
		}
	}
	response.headers.set('cache-control', 'no-store');
	return response;
}

/** A JSON success response. */
export const ok = (body: unknown, status = 200, headers?: Record<string, string>) =>
	json(body, { status, headers });
