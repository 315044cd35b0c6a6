import { error, redirect } from '@sveltejs/kit';
import { loanListQuerySchema } from '$lib/schemas/lists';
import { requireRole, writers } from '$lib/server/auth';
import { parseSmallForm } from '$lib/server/forms';
import { duplicateLoan, listLoans } from '$lib/server/loans';
import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event);
	const parsed = loanListQuerySchema.safeParse(Object.fromEntries(event.url.searchParams));
	const query = parsed.success ? parsed.data : { sort: 'updated' as const, page: 1 };
	return {
		query,
		canWrite: writers.loans.includes(actor.role),
		...(await listLoans(actor.workspace.id, query))
	};
};

export const actions: Actions = {
	duplicate: async (event) => {
		const actor = await requireRole(event, ...writers.loans);
		const { loanId } = await parseSmallForm(event.request, z.object({ loanId: z.uuid() }));
		const copy = await duplicateLoan(
			{ workspaceId: actor.workspace.id, actorId: actor.user.id },
			loanId
		);
		if (!copy) error(404, 'Not found');
		if (!copy.ok) error(409, copy.message);
		redirect(303, `/app/loans/${copy.loanId}`);
	}
};
