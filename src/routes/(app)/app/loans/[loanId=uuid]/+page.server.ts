import { error, fail } from '@sveltejs/kit';
import { z } from 'zod';
import { emailDisclosureSchema, toleranceCheckSchema } from '$lib/schemas/tolerance';
import { requireRole, writers } from '$lib/server/auth';
import { parseSmallForm } from '$lib/server/forms';
import { getLoan, listVersions, markDisclosed, updateLoan } from '$lib/server/loans';
import { listChecks, resolveCheck, runToleranceCheck } from '$lib/server/loans/checks';
import { formsFor, submitEntry, submitTerms } from '$lib/server/loans/forms';
import { emailDisclosure } from '$lib/server/loans/mail';
import { loanView } from '$lib/server/loans/view';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event);
	const version = Number(event.url.searchParams.get('version')) || undefined;
	const found = await getLoan(actor.workspace.id, event.params.loanId, version);
	if (!found) error(404, 'Not found');
	const [checks, versions, forms] = await Promise.all([
		listChecks(found.loan.id),
		listVersions(found.loan.id),
		formsFor(found.file)
	]);
	return {
		loan: found.loan,
		version: found.version.version,
		isCurrent: found.version.version === found.loan.currentVersion,
		view: loanView(found.file, found.solve),
		checks,
		versions,
		...forms,
		canWrite: writers.loans.includes(actor.role)
	};
};

const acting = (actor: Awaited<ReturnType<typeof requireRole>>) => ({
	workspaceId: actor.workspace.id,
	actorId: actor.user.id
});

export const actions: Actions = {
	terms: async (event) => {
		const actor = await requireRole(event, ...writers.loans);
		const done = await submitTerms(event.request, (file) =>
			updateLoan(acting(actor), event.params.loanId, file)
		);
		return done.form ?? { form: done.valid, saved: done.outcome.version };
	},
	entry: async (event) => {
		const actor = await requireRole(event, ...writers.loans);
		const done = await submitEntry(event.request, (file) =>
			updateLoan(acting(actor), event.params.loanId, file)
		);
		return done.form ?? { form: done.valid, saved: done.outcome.version };
	},
	check: async (event) => {
		const actor = await requireRole(event, ...writers.loans);
		const parsed = toleranceCheckSchema.safeParse(
			Object.fromEntries(await event.request.formData())
		);
		if (!parsed.success) return fail(400, { checkProblem: parsed.error.issues[0].message });
		const outcome = await runToleranceCheck(acting(actor), event.params.loanId, {
			disclosedApr: parsed.data.disclosedApr,
			disclosedFinanceCharge: parsed.data.disclosedFinanceCharge || undefined
		});
		if (!outcome) error(404, 'Not found');
		if (!outcome.ok) return fail(409, { checkProblem: outcome.message });
		return { checked: outcome.id };
	},
	resolve: async (event) => {
		const actor = await requireRole(event, ...writers.loans);
		const { checkId } = await parseSmallForm(event.request, z.object({ checkId: z.uuid() }));
		if (!(await resolveCheck(acting(actor), checkId))) error(404, 'Not found');
		return { resolved: checkId };
	},
	disclose: async (event) => {
		const actor = await requireRole(event, ...writers.loans);
		if (!(await markDisclosed(acting(actor), event.params.loanId))) error(404, 'Not found');
		return { disclosed: true };
	},
	email: async (event) => {
		const actor = await requireRole(event, ...writers.loans);
		const parsed = emailDisclosureSchema.safeParse(
			Object.fromEntries(await event.request.formData())
		);
		if (!parsed.success) return fail(400, { emailProblem: parsed.error.issues[0].message });
		const found = await getLoan(actor.workspace.id, event.params.loanId);
		if (!found) error(404, 'Not found');
		await emailDisclosure(
			{ ...acting(actor), senderName: actor.user.name ?? actor.user.email },
			found,
			parsed.data.to
		);
		return { emailed: parsed.data.to };
	}
};
