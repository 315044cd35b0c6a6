import { z } from 'zod';
import { requireRole, writers } from '$lib/server/auth';
import { listDeals } from '$lib/server/deals';
import type { PageServerLoad } from './$types';

const querySchema = z.object({
	q: z.string().trim().max(100).optional(),
	sort: z.enum(['updated', 'name', 'solved']).default('updated'),
	page: z.coerce.number().int().min(1).max(100_000).default(1)
});

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event);
	const parsed = querySchema.safeParse(Object.fromEntries(event.url.searchParams));
	const query = parsed.success ? parsed.data : { sort: 'updated' as const, page: 1 };
	return {
		query,
		canWrite: writers.deals.includes(actor.role),
		...(await listDeals(actor.workspace.id, query))
	};
};
