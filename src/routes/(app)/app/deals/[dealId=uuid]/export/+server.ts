import { error } from '@sveltejs/kit';
import { appendAuditEvent } from '$lib/server/audit';
import { requireRole } from '$lib/server/auth';
import { db } from '$lib/server/db';
import { getDeal } from '$lib/server/deals';
import { analyseDeal } from '$lib/server/deals/analysis';
import { dealWorkbook } from '$lib/server/deals/share';
import type { RequestHandler } from './$types';

/** The deal as xlsx: Flows (with present-value formulas), Results, NPV profile, Trace. Any role. */
export const GET: RequestHandler = async (event) => {
	const actor = await requireRole(event);
	const version = Number(event.url.searchParams.get('version')) || undefined;
	const found = await getDeal(actor.workspace.id, event.params.dealId, version);
	if (!found) error(404, 'Not found');
	const body = await dealWorkbook(found.deal.name, found.content, analyseDeal(found.content));
	await db.transaction((tx) =>
		appendAuditEvent(tx, {
			workspaceId: actor.workspace.id,
			actorId: actor.user.id,
			action: 'deal.export',
			subject: `deal:${found.deal.id}`,
			payload: { version: found.version, format: 'xlsx' }
		})
	);
	return new Response(body as BodyInit, {
		headers: {
			'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
			'content-disposition': `attachment; filename="pincer-deal-${found.deal.name.replace(/[^\w-]+/g, '_')}-v${found.version}.xlsx"`,
			'cache-control': 'no-store'
		}
	});
};
