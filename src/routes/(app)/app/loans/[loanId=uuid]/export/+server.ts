import { error } from '@sveltejs/kit';
import { appendAuditEvent } from '$lib/server/audit';
import { requireRole } from '$lib/server/auth';
import { db } from '$lib/server/db';
import { getLoan } from '$lib/server/loans';
import { loanWorkbook } from '$lib/server/loans/export';
import { loanView } from '$lib/server/loans/view';
import { traceRuns } from '$lib/server/solves/trace';
import type { SolveRequest } from '$lib/schemas/solve';
import type { RequestHandler } from './$types';

/** The loan file as xlsx (Terms, Schedule with formulas, Disclosure, Trace); every role may export. */
export const GET: RequestHandler = async (event) => {
	const actor = await requireRole(event);
	const version = Number(event.url.searchParams.get('version')) || undefined;
	const found = await getLoan(actor.workspace.id, event.params.loanId, version);
	if (!found || !found.solve) error(404, 'Not found');
	const view = loanView(found.file, found.solve);
	const body = await loanWorkbook({
		file: found.file,
		figures: view.figures,
		result: found.solve.result,
		version: found.version.version,
		engineVersion: found.solve.engineVersion,
		trace: traceRuns(found.solve.request as unknown as SolveRequest, found.solve.result)
	});
	await db.transaction((tx) =>
		appendAuditEvent(tx, {
			workspaceId: actor.workspace.id,
			actorId: actor.user.id,
			action: 'loan.export',
			subject: `loan:${found.loan.id}`,
			payload: { version: found.version.version, format: 'xlsx' }
		})
	);
	const name = `pincer-loan-${found.loan.reference.replace(/[^\w-]+/g, '_')}-v${found.version.version}.xlsx`;
	return new Response(body as BodyInit, {
		headers: {
			'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
			'content-disposition': `attachment; filename="${name}"`,
			'cache-control': 'no-store'
		}
	});
};
