// The guard of the REST API: an API key (Authorization: Bearer pincer_…) or, for the app's own
// client-side calls, the session cookie. Failures are ApiErrors, answered as JSON by apiCall.
import type { RequestEvent } from '@sveltejs/kit';
import { env } from '$env/dynamic/private';
import { ApiError } from '../api/errors';
import { useApiKey } from '../api/keys';
import { readOnlyMessage, readOnlyReason } from '../billing/status';
import type { Role } from '../db/schema';
import { requireRole } from './guards';

export type ApiCaller = {
	workspaceId: string;
	/** The key's creator, or the signed-in user: the actor of every audit event. */
	actorId: string;
	role: Role;
	via: 'key' | 'session';
	keyId: string | null;
};

/** Requests per key per minute (PINCER_API_RATE_LIMIT, default 600). */
export function apiRateLimit(): number {
	const value = Number(env.PINCER_API_RATE_LIMIT);
	return Number.isInteger(value) && value > 0 ? value : 600;
}

const callers = new WeakMap<RequestEvent, ApiCaller>();

/** The caller requireApiCaller identified for this request, if any (used to audit the call). */
export const apiCallerOf = (event: RequestEvent) => callers.get(event) ?? null;

const BEARER = /^Bearer +(\S+)$/i;
const READS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * The API caller, with a role among `roles` (any role when none given). Unknown, malformed or
 * revoked key → 401; over the key's rate limit → 429 with Retry-After; scope lacking, or a write
 * in a read-only (unpaid) workspace → 403. Without an Authorization header the session cookie
 * decides, through requireRole (which applies the same read-only rule).
 */
export async function requireApiCaller(event: RequestEvent, ...roles: Role[]): Promise<ApiCaller> {
	const header = event.request.headers.get('authorization');
	if (header === null) {
		const actor = await requireRole(event, ...roles);
		const caller: ApiCaller = {
			workspaceId: actor.workspace.id,
			actorId: actor.user.id,
			role: actor.role,
			via: 'session',
			keyId: null
		};
		callers.set(event, caller);
		return caller;
	}
	const presented = BEARER.exec(header.trim())?.[1];
	if (!presented) {
		throw new ApiError(401, 'unauthenticated', 'Send the key as Authorization: Bearer <key>.');
	}
	const use = await useApiKey(presented, apiRateLimit());
	if (use.status === 'unknown')
		throw new ApiError(401, 'unauthenticated', 'This API key is not known.');
	if (use.status === 'revoked' || !use.actorId) {
		throw new ApiError(
			401,
			'unauthenticated',
			use.status === 'revoked'
				? 'This API key was revoked; ask an admin of the workspace for a new one.'
				: 'The person who created this API key no longer exists; ask an admin for a new key.'
		);
	}
	const caller: ApiCaller = {
		workspaceId: use.workspaceId,
		actorId: use.actorId,
		role: use.scope,
		via: 'key',
		keyId: use.keyId
	};
	callers.set(event, caller);
	if (use.status === 'limited') {
		throw new ApiError(
			429,
			'rate_limited',
			`This key made more than ${apiRateLimit()} requests this minute; try again in ${use.retryAfter} s.`,
			undefined,
			{ 'retry-after': String(use.retryAfter) }
		);
	}
	if (roles.length && !roles.includes(use.scope)) {
		throw new ApiError(
			403,
			'forbidden',
			`A key with the ${use.scope} scope cannot do this; it needs one of: ${roles.filter((r) => r !== 'admin').join(', ')}.`
		);
	}
	const readOnly = READS.has(event.request.method) ? null : readOnlyReason(use.standing);
	if (readOnly) throw new ApiError(403, 'forbidden', readOnlyMessage(use.standing, readOnly));
	return caller;
}
