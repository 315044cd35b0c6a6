import { json } from '@sveltejs/kit';
import { checkHealth } from '$lib/server/health';
import type { RequestHandler } from './$types';

// Public by design (listed in the guard-coverage allowlist): it reveals no workspace data.
export const GET: RequestHandler = async () => {
	const health = await checkHealth();
	return json(health, {
		status: health.status === 'ok' ? 200 : 503,
		headers: { 'cache-control': 'no-store' }
	});
};
