import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth';
import { getLoan } from '$lib/server/loans';
import { loanView } from '$lib/server/loans/view';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event);
	const version = Number(event.url.searchParams.get('version')) || undefined;
	const found = await getLoan(actor.workspace.id, event.params.loanId, version);
	if (!found) error(404, 'Not found');
	const { trace: _trace, ...view } = loanView(found.file, found.solve);
	return {
		loan: found.loan,
		version: found.version.version,
		view,
		workspace: actor.workspace.name
	};
};
