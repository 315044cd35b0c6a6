import { fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { parsePastedFlows } from '$lib/deal-paste';
import { dealContentSchema } from '$lib/schemas/deal';
import { requireRole, writers } from '$lib/server/auth';
import { createDeal } from '$lib/server/deals';
import { contentFromUpload } from '$lib/server/deals/import';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireRole(event, ...writers.deals);
	return {};
};

const acting = (actor: Awaited<ReturnType<typeof requireRole>>) => ({
	workspaceId: actor.workspace.id,
	actorId: actor.user.id
});
const name = z
	.string()
	.trim()
	.min(1, { error: 'Name the deal.' })
	.max(120, { error: 'Use at most 120 characters.' });

export const actions: Actions = {
	paste: async (event) => {
		const actor = await requireRole(event, ...writers.deals);
		const form = await event.request.formData();
		const dealName = name.safeParse(form.get('name'));
		if (!dealName.success)
			return fail(400, {
				problem: dealName.error.issues[0].message,
				paste: String(form.get('rows') ?? '')
			});
		const mode = form.get('mode') === 'periodic' ? 'periodic' : 'dated';
		const pasted = parsePastedFlows(String(form.get('rows') ?? ''), mode);
		if (!pasted.ok)
			return fail(400, {
				problem: pasted.message,
				paste: String(form.get('rows') ?? ''),
				name: dealName.data
			});
		const content = dealContentSchema.safeParse({
			mode,
			periodsPerYear: Number(form.get('periodsPerYear') || 1),
			flows: pasted.flows
		});
		if (!content.success)
			return fail(400, {
				problem: content.error.issues[0].message,
				paste: String(form.get('rows') ?? ''),
				name: dealName.data
			});
		const created = await createDeal(acting(actor), dealName.data, content.data);
		redirect(303, `/app/deals/${created!.dealId}`);
	},
	upload: async (event) => {
		const actor = await requireRole(event, ...writers.deals);
		const form = await event.request.formData();
		const dealName = name.safeParse(form.get('name'));
		if (!dealName.success)
			return fail(400, { uploadProblems: [{ message: dealName.error.issues[0].message }] });
		const read = await contentFromUpload(form);
		if (!read.ok) return fail(400, { uploadProblems: read.problems });
		const created = await createDeal(acting(actor), dealName.data, read.content, read.file);
		redirect(303, `/app/deals/${created!.dealId}`);
	}
};
