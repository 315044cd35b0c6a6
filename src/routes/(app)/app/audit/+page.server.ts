import { auditFilterSchema } from '$lib/schemas/audit';
import { appendAuditEvent, checkChain, listAuditEvents } from '$lib/server/audit';
import { requireRole, writers } from '$lib/server/auth';
import { db } from '$lib/server/db';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event, ...writers.audit);
	const parsed = auditFilterSchema.safeParse(Object.fromEntries(event.url.searchParams));
	const filter = parsed.success ? parsed.data : { page: 1 };
	const problem = parsed.success
		? null
		: `${parsed.error.issues[0].path.join('.')}: ${parsed.error.issues[0].message}`;
	return { filter, problem, ...(await listAuditEvents(actor.workspace.id, filter)) };
};

export const actions: Actions = {
	check: async (event) => {
		const actor = await requireRole(event, ...writers.audit);
		const result = await checkChain(db, actor.workspace.id);
		await db.transaction((tx) =>
			appendAuditEvent(tx, {
				workspaceId: actor.workspace.id,
				actorId: actor.user.id,
				action: 'audit.chain.check',
				subject: `workspace:${actor.workspace.id}`,
				payload: result.intact
					? { intact: true, events: result.events }
					: { intact: false, brokenAt: result.brokenAt.id }
			})
		);
		return { chain: result };
	}
};
