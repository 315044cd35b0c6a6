import { json } from '@sveltejs/kit';
import { openApiDocument } from '$lib/server/api/openapi';
import type { RequestHandler } from './$types';

// Public by design (listed in the guard-coverage allowlist): the API's description, no data.
export const GET: RequestHandler = () =>
	json(openApiDocument(), { headers: { 'cache-control': 'public, max-age=300' } });
