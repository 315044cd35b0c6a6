import { errorResponse } from '$lib/server/api/errors';
import { notFound } from '$lib/server/api/input';
import type { RequestHandler } from './$types';

// Public by design (listed in the guard-coverage allowlist): answers paths the API does not have
// with its JSON error instead of an HTML page; it reads nothing.
export const fallback: RequestHandler = (event) =>
	errorResponse(notFound(), event.locals.requestId);
