// Deals through the API: the same services as the deal screens, mapped onto API errors and the
// documented response shapes.
import type { z } from 'zod';
import type { DealInput, dealListSchema, dealSchema } from '$lib/schemas/api';
import { createDeal, getDeal, listDeals, updateDeal, type DealListQuery } from '../deals';
import { notFound } from './input';
import { iso, presentSolve, unpadded } from './present';

/** Rows per page of GET /deals (the deals list's own page size). */
export const DEALS_PAGE_SIZE = 25;

type Acting = { workspaceId: string; actorId: string };
type Deal = z.input<typeof dealSchema>;

/** Creates (dealId null) or versions a deal; returns the stored deal as GET /deals/{id} shows it. */
export async function saveDeal(acting: Acting, dealId: string | null, input: DealInput) {
	const saved = dealId
		? await updateDeal(acting, dealId, input.name, input.content)
		: await createDeal(acting, input.name, input.content);
	if (!saved) throw notFound();
	return dealById(acting.workspaceId, saved.dealId);
}

export async function dealById(workspaceId: string, dealId: string, version?: number) {
	const found = await getDeal(workspaceId, dealId, version);
	if (!found) throw notFound();
	const { deal } = found;
	return {
		id: deal.id,
		name: deal.name,
		scenarioOf: deal.scenarioOf,
		version: found.version,
		currentVersion: deal.currentVersion,
		createdAt: iso(deal.createdAt),
		updatedAt: iso(deal.updatedAt),
		content: found.content,
		solve: found.solve ? presentSolve(found.solve) : null
	} satisfies Deal;
}

export async function dealPage(
	workspaceId: string,
	query: DealListQuery
): Promise<z.input<typeof dealListSchema>> {
	const list = await listDeals(workspaceId, query);
	return {
		items: list.rows.map((row) => ({
			id: row.id,
			name: row.name,
			scenarioOf: row.scenarioOf,
			version: row.version,
			kind: row.kind as 'irr' | 'dated-irr' | null,
			status: row.status as 'solved' | 'multiple-roots' | 'no-root' | null,
			rate: unpadded(row.rate),
			updatedAt: iso(row.updatedAt),
			lastSolvedAt: row.lastSolvedAt ? iso(row.lastSolvedAt) : null
		})),
		page: list.page,
		pages: list.pages,
		pageSize: DEALS_PAGE_SIZE,
		total: list.total
	};
}
