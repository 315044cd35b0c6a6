import { redirect } from '@sveltejs/kit';
import { requireRole, writers } from '$lib/server/auth';
import { createLoan } from '$lib/server/loans';
import { formsFor, submitEntry, submitTerms } from '$lib/server/loans/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireRole(event, ...writers.loans);
	return formsFor(null);
};

export const actions: Actions = {
	terms: async (event) => {
		const actor = await requireRole(event, ...writers.loans);
		const acting = { workspaceId: actor.workspace.id, actorId: actor.user.id };
		const done = await submitTerms(event.request, (file) => createLoan(acting, file));
		if (done.form) return done.form;
		redirect(303, `/app/loans/${done.outcome.loanId}`);
	},
	entry: async (event) => {
		const actor = await requireRole(event, ...writers.loans);
		const acting = { workspaceId: actor.workspace.id, actorId: actor.user.id };
		const done = await submitEntry(event.request, (file) => createLoan(acting, file));
		if (done.form) return done.form;
		redirect(303, `/app/loans/${done.outcome.loanId}`);
	}
};
