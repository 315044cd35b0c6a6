import { fail, redirect } from '@sveltejs/kit';
import { loanHeaderSchema } from '$lib/schemas/loan';
import { requireRole, writers } from '$lib/server/auth';
import { createLoan } from '$lib/server/loans';
import { formsFor, submitEntry, submitTerms } from '$lib/server/loans/forms';
import { scheduleFromFile } from '$lib/server/loans/import';
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
	file: async (event) => {
		const actor = await requireRole(event, ...writers.loans);
		const form = await event.request.formData();
		const header = loanHeaderSchema.safeParse(Object.fromEntries(form));
		if (!header.success) return fail(400, { fileProblems: [header.error.issues[0].message] });
		const file = form.get('file');
		if (!(file instanceof File) || file.size === 0)
			return fail(400, { fileProblems: ['Choose a file: the upload was empty.'] });
		const read = await scheduleFromFile(file.name, new Uint8Array(await file.arrayBuffer()));
		if (!read.ok) return fail(400, { fileProblems: read.problems });
		const acting = { workspaceId: actor.workspace.id, actorId: actor.user.id };
		const saved = await createLoan(acting, {
			entryMode: 'schedule',
			header: header.data,
			rows: read.rows
		});
		if (!saved.ok) return fail(400, { fileProblems: [saved.message] });
		redirect(303, `/app/loans/${saved.loanId}`);
	},
	entry: async (event) => {
		const actor = await requireRole(event, ...writers.loans);
		const acting = { workspaceId: actor.workspace.id, actorId: actor.user.id };
		const done = await submitEntry(event.request, (file) => createLoan(acting, file));
		if (done.form) return done.form;
		redirect(303, `/app/loans/${done.outcome.loanId}`);
	}
};
