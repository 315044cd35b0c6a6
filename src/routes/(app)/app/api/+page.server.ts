import { requireRole } from '$lib/server/auth';
import { MAX_BODY_BYTES } from '$lib/server/api/input';
import { referenceEntries } from '$lib/server/api/reference';
import { apiRateLimit } from '$lib/server/auth/api-keys';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event);
	return {
		origin: event.url.origin,
		entries: referenceEntries(event.url.origin),
		limits: { perMinute: apiRateLimit(), bodyMegabytes: MAX_BODY_BYTES / 1048576 },
		isAdmin: actor.role === 'admin'
	};
};
