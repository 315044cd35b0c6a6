import { z } from 'zod';

/** Query of the loans list: search text, status filter, sort and page. */
export const loanListQuerySchema = z.object({
	q: z.string().trim().max(100).optional().describe('Part of the reference or borrower name'),
	status: z
		.enum(['draft', 'disclosed'])
		.optional()
		.or(z.literal('').transform(() => undefined)),
	sort: z.enum(['updated', 'reference', 'borrower']).default('updated'),
	page: z.coerce.number().int().min(1).max(100_000).default(1)
});
