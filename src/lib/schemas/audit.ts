import { z } from 'zod';

const day = z
	.string()
	.regex(/^\d{4}-\d{2}-\d{2}$/, { error: 'Use a date such as 2026-12-01.' })
	.optional()
	.or(z.literal('').transform(() => undefined));

/** Filters of the audit trail screen, its exports and GET /api/v1/audit. */
export const auditFilterSchema = z.object({
	who: z.string().trim().max(200).optional().describe('Part of the actor’s e-mail or name'),
	what: z
		.string()
		.trim()
		.max(100)
		.optional()
		.describe('Start of the action, e.g. "member." or "auth.signin"'),
	from: day.describe('First day (UTC), inclusive'),
	to: day.describe('Last day (UTC), inclusive'),
	page: z.coerce.number().int().min(1).max(100_000).default(1)
});
export type AuditFilter = z.output<typeof auditFilterSchema>;
