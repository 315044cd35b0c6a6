import { error } from '@sveltejs/kit';
import { auditFilterSchema } from '$lib/schemas/audit';
import { allAuditEvents, appendAuditEvent } from '$lib/server/audit';
import { requireRole, writers } from '$lib/server/auth';
import { db } from '$lib/server/db';
import { auditCsv, auditXlsx } from '$lib/server/exports/audit';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const actor = await requireRole(event, ...writers.audit);
	const format = event.url.searchParams.get('format');
	if (format !== 'csv' && format !== 'xlsx') error(400, 'format: choose csv or xlsx.');
	const parsed = auditFilterSchema.safeParse(Object.fromEntries(event.url.searchParams));
	if (!parsed.success)
		error(400, `${parsed.error.issues[0].path.join('.')}: ${parsed.error.issues[0].message}`);
	const rows = await allAuditEvents(actor.workspace.id, parsed.data);
	await db.transaction((tx) =>
		appendAuditEvent(tx, {
			workspaceId: actor.workspace.id,
			actorId: actor.user.id,
			action: 'audit.export',
			subject: `workspace:${actor.workspace.id}`,
			payload: { format, rows: rows.length, filter: { ...parsed.data, page: undefined } }
		})
	);
	const stamp = new Date().toISOString().slice(0, 10);
	const name = `pincer-audit-${actor.workspace.slug}-${stamp}.${format}`;
	const body =
		format === 'csv'
			? auditCsv(rows)
			: await auditXlsx(rows, `Audit trail of ${actor.workspace.name}`);
	return new Response(body as BodyInit, {
		headers: {
			'content-type':
				format === 'csv'
					? 'text/csv; charset=utf-8'
					: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
			'content-disposition': `attachment; filename="${name}"`,
			'cache-control': 'no-store'
		}
	});
};
