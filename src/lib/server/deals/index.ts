import { and, asc, count, desc, eq, ilike, isNull, or } from 'drizzle-orm';
import type { DealContent } from '../../schemas/deal';
import type { SolveResult } from '../../schemas/solve';
import { appendAuditEvent } from '../audit/chain';
import { db } from '../db';
import { dealFiles, deals, dealVersions, solves, users } from '../db/schema';
import { solveAndRecord } from '../solves';
import { solveRequestFor } from './analysis';

export type Acting = { workspaceId: string; actorId: string };
export type UploadedFile = { fileName: string; contentType: string; bytes: Uint8Array };

const PAGE = 25;

function describeChanges(before: DealContent | null, after: DealContent): string[] {
	if (!before) return ['first version'];
	const changes: string[] = [];
	for (const key of [
		'mode',
		'periodsPerYear',
		'dayCount',
		'signConvention',
		'hurdleRate',
		'financeRate',
		'reinvestRate',
		'method'
	] as const) {
		if (String(before[key]) !== String(after[key]))
			changes.push(`${key} ${before[key]} → ${after[key]}`);
	}
	if (JSON.stringify(before.flows) !== JSON.stringify(after.flows))
		changes.push(`flows changed (${before.flows.length} → ${after.flows.length} rows)`);
	return changes.length ? changes : ['saved without changes'];
}

async function save(
	acting: Acting,
	dealId: string | null,
	name: string,
	content: DealContent,
	file?: UploadedFile,
	scenarioOf?: string | null
) {
	return db.transaction(async (tx) => {
		let id = dealId;
		let version = 1;
		let previous: DealContent | null = null;
		if (id) {
			const [deal] = await tx
				.select({ currentVersion: deals.currentVersion })
				.from(deals)
				.where(and(eq(deals.id, id), eq(deals.workspaceId, acting.workspaceId)))
				.for('update');
			if (!deal) return null;
			const [last] = await tx
				.select({ content: dealVersions.content })
				.from(dealVersions)
				.where(and(eq(dealVersions.dealId, id), eq(dealVersions.version, deal.currentVersion)));
			previous = (last?.content as unknown as DealContent) ?? null;
			version = deal.currentVersion + 1;
		} else {
			const [created] = await tx
				.insert(deals)
				.values({
					workspaceId: acting.workspaceId,
					name,
					scenarioOf: scenarioOf ?? null,
					ownerId: acting.actorId
				})
				.returning({ id: deals.id });
			id = created.id;
		}
		const solved = await solveAndRecord(
			tx,
			acting,
			{ type: 'deal', id, version },
			solveRequestFor(content)
		);
		const changes = describeChanges(previous, content);
		await tx.insert(dealVersions).values({
			dealId: id,
			version,
			content: content as unknown as Record<string, unknown>,
			changes,
			createdBy: acting.actorId
		});
		await tx
			.update(deals)
			.set({
				name,
				currentVersion: version,
				lastSolveId: solved.id,
				lastSolvedAt: new Date(),
				updatedAt: new Date()
			})
			.where(eq(deals.id, id));
		if (file) {
			await tx.insert(dealFiles).values({
				dealId: id,
				version,
				fileName: file.fileName,
				contentType: file.contentType,
				size: file.bytes.byteLength,
				bytes: Buffer.from(file.bytes),
				uploadedBy: acting.actorId
			});
		}
		await appendAuditEvent(tx, {
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: version === 1 ? (scenarioOf ? 'deal.scenario.create' : 'deal.create') : 'deal.update',
			subject: `deal:${id}`,
			payload: {
				name,
				version,
				changes,
				flows: content.flows.length,
				file: file ? { name: file.fileName, size: file.bytes.byteLength } : null
			}
		});
		return { dealId: id, version, solveId: solved.id };
	});
}

/** Creates a deal with its first version, solved and audited (and the uploaded file kept, if any). */
export const createDeal = (
	acting: Acting,
	name: string,
	content: DealContent,
	file?: UploadedFile
) => save(acting, null, name, content, file);
/** Saves a new version of a deal (never overwrites); null when the deal is not in this workspace. */
export const updateDeal = (
	acting: Acting,
	dealId: string,
	name: string,
	content: DealContent,
	file?: UploadedFile
) => save(acting, dealId, name, content, file);

export type DealListQuery = { q?: string; sort?: 'updated' | 'name' | 'solved'; page?: number };

export async function listDeals(workspaceId: string, query: DealListQuery) {
	const page = Math.max(1, query.page ?? 1);
	const like = query.q ? `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : null;
	const where = and(
		eq(deals.workspaceId, workspaceId),
		like ? or(ilike(deals.name, like)) : undefined
	);
	const order =
		query.sort === 'name'
			? asc(deals.name)
			: query.sort === 'solved'
				? desc(deals.lastSolvedAt)
				: desc(deals.updatedAt);
	const [rows, [{ total }]] = await Promise.all([
		db
			.select({
				id: deals.id,
				name: deals.name,
				scenarioOf: deals.scenarioOf,
				version: deals.currentVersion,
				updatedAt: deals.updatedAt,
				lastSolvedAt: deals.lastSolvedAt,
				owner: users.name,
				status: solves.status,
				kind: solves.kind,
				rate: solves.rate
			})
			.from(deals)
			.leftJoin(users, eq(users.id, deals.ownerId))
			.leftJoin(solves, eq(solves.id, deals.lastSolveId))
			.where(where)
			.orderBy(order, asc(deals.id))
			.limit(PAGE)
			.offset((page - 1) * PAGE),
		db.select({ total: count() }).from(deals).where(where)
	]);
	return { rows, total, page, pages: Math.max(1, Math.ceil(total / PAGE)) };
}

/** A deal of this workspace with a version's content and the latest stored solve; null when not here. */
export async function getDeal(workspaceId: string, dealId: string, version?: number) {
	const [deal] = await db
		.select()
		.from(deals)
		.where(and(eq(deals.id, dealId), eq(deals.workspaceId, workspaceId)));
	if (!deal) return null;
	const [row] = await db
		.select()
		.from(dealVersions)
		.where(
			and(eq(dealVersions.dealId, dealId), eq(dealVersions.version, version ?? deal.currentVersion))
		);
	if (!row) return null;
	const [solve] = deal.lastSolveId
		? await db.select().from(solves).where(eq(solves.id, deal.lastSolveId))
		: [];
	return {
		deal,
		version: row.version,
		content: row.content as unknown as DealContent,
		solve: solve ? { ...solve, result: solve.result as unknown as SolveResult } : null
	};
}

export async function listDealVersions(dealId: string) {
	return db
		.select({
			version: dealVersions.version,
			changes: dealVersions.changes,
			createdAt: dealVersions.createdAt,
			by: users.name
		})
		.from(dealVersions)
		.leftJoin(users, eq(users.id, dealVersions.createdBy))
		.where(eq(dealVersions.dealId, dealId))
		.orderBy(desc(dealVersions.version));
}

export async function listDealFiles(dealId: string) {
	return db
		.select({
			id: dealFiles.id,
			version: dealFiles.version,
			fileName: dealFiles.fileName,
			size: dealFiles.size,
			createdAt: dealFiles.createdAt
		})
		.from(dealFiles)
		.where(eq(dealFiles.dealId, dealId))
		.orderBy(desc(dealFiles.createdAt));
}

export async function getDealFile(workspaceId: string, dealId: string, fileId: string) {
	const [row] = await db
		.select({
			fileName: dealFiles.fileName,
			contentType: dealFiles.contentType,
			bytes: dealFiles.bytes
		})
		.from(dealFiles)
		.innerJoin(deals, eq(deals.id, dealFiles.dealId))
		.where(
			and(
				eq(dealFiles.id, fileId),
				eq(dealFiles.dealId, dealId),
				eq(deals.workspaceId, workspaceId)
			)
		);
	return row ?? null;
}

/** Copies a deal's current flows into a new scenario of the same base deal. */
export async function createScenario(acting: Acting, dealId: string) {
	const found = await getDeal(acting.workspaceId, dealId);
	if (!found) return null;
	const base = found.deal.scenarioOf ?? found.deal.id;
	const [{ n }] = await db.select({ n: count() }).from(deals).where(eq(deals.scenarioOf, base));
	const baseName = found.deal.scenarioOf
		? found.deal.name.replace(/ — scenario \d+$/, '')
		: found.deal.name;
	return save(acting, null, `${baseName} — scenario ${n + 1}`, found.content, undefined, base);
}

/** The base deal and all its scenarios, for side-by-side comparison. */
export async function scenarioFamily(workspaceId: string, dealId: string) {
	const [deal] = await db
		.select({ scenarioOf: deals.scenarioOf })
		.from(deals)
		.where(and(eq(deals.id, dealId), eq(deals.workspaceId, workspaceId)));
	if (!deal) return [];
	const base = deal.scenarioOf ?? dealId;
	return db
		.select({
			id: deals.id,
			name: deals.name,
			scenarioOf: deals.scenarioOf,
			version: deals.currentVersion
		})
		.from(deals)
		.where(
			and(eq(deals.workspaceId, workspaceId), or(eq(deals.id, base), eq(deals.scenarioOf, base)))
		)
		.orderBy(desc(isNull(deals.scenarioOf)), asc(deals.createdAt));
}
