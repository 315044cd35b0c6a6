import { error, fail, redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { emailDisclosureSchema } from '$lib/schemas/tolerance';
import { requireRole, writers } from '$lib/server/auth';
import {
	createScenario,
	getDeal,
	listDealFiles,
	listDealVersions,
	updateDeal
} from '$lib/server/deals';
import { analyseDeal } from '$lib/server/deals/analysis';
import { compareScenarios, emailDeal } from '$lib/server/deals/share';
import { contentFromUpload } from '$lib/server/deals/import';
import { parseContent, parseJsonField } from '$lib/server/deals/requests';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event);
	const version = Number(event.url.searchParams.get('version')) || undefined;
	const found = await getDeal(actor.workspace.id, event.params.dealId, version);
	if (!found) error(404, 'Not found');
	const [versions, files, scenarios] = await Promise.all([
		listDealVersions(found.deal.id),
		listDealFiles(found.deal.id),
		compareScenarios(actor.workspace.id, found.deal.id)
	]);
	return {
		deal: {
			id: found.deal.id,
			name: found.deal.name,
			scenarioOf: found.deal.scenarioOf,
			currentVersion: found.deal.currentVersion
		},
		version: found.version,
		content: found.content,
		// Long schedules load faster without the textbook traces; the page fetches them on request.
		analysis: analyseDeal(found.content, { traces: found.content.flows.length <= 2000 }),
		versions,
		files,
		scenarios,
		canWrite: writers.deals.includes(actor.role)
	};
};

const acting = (actor: Awaited<ReturnType<typeof requireRole>>) => ({
	workspaceId: actor.workspace.id,
	actorId: actor.user.id
});

export const actions: Actions = {
	save: async (event) => {
		const actor = await requireRole(event, ...writers.deals);
		const form = await event.request.formData();
		const name = z.string().trim().min(1).max(120).safeParse(form.get('name'));
		if (!name.success) return fail(400, { problem: 'Name the deal.' });
		const parsed = parseContent(parseJsonField(form.get('content')));
		if (!parsed.ok) return fail(400, { problem: parsed.issues[0].message, issues: parsed.issues });
		const saved = await updateDeal(acting(actor), event.params.dealId, name.data, parsed.content);
		if (!saved) error(404, 'Not found');
		return { saved: saved.version };
	},
	scenario: async (event) => {
		const actor = await requireRole(event, ...writers.deals);
		const copy = await createScenario(acting(actor), event.params.dealId);
		if (!copy) error(404, 'Not found');
		redirect(303, `/app/deals/${copy.dealId}`);
	},
	importFile: async (event) => {
		const actor = await requireRole(event, ...writers.deals);
		const found = await getDeal(actor.workspace.id, event.params.dealId);
		if (!found) error(404, 'Not found');
		const read = await contentFromUpload(await event.request.formData(), found.content);
		if (!read.ok) return fail(400, { uploadProblems: read.problems });
		const saved = await updateDeal(
			acting(actor),
			event.params.dealId,
			found.deal.name,
			read.content,
			read.file
		);
		return { saved: saved?.version };
	},
	email: async (event) => {
		const actor = await requireRole(event, ...writers.deals);
		const parsed = emailDisclosureSchema.safeParse(
			Object.fromEntries(await event.request.formData())
		);
		if (!parsed.success) return fail(400, { emailProblem: parsed.error.issues[0].message });
		const found = await getDeal(actor.workspace.id, event.params.dealId);
		if (!found) error(404, 'Not found');
		await emailDeal(
			{ ...acting(actor), senderName: actor.user.name ?? actor.user.email },
			found,
			parsed.data.to
		);
		return { emailed: parsed.data.to };
	}
};
