import { and, eq } from 'drizzle-orm';
import type { SolveRequest, SolveResult } from '$lib/schemas/solve';
import { appendAuditEvent } from '../audit/chain';
import { db } from '../db';
import { solves } from '../db/schema';
import type { Executor } from '../db/types';
import { solve } from '../solver';
import { appVersion } from '../version';

/** Stored with every solve so that an examiner can tell which engine produced a result. */
export const ENGINE_VERSION = `pincer ${appVersion} (decimal.js 10.6.0, 40 digits)`;

type Subject = { type: 'loan' | 'deal' | 'api'; id?: string | null; version?: number | null };

/** Runs the engine and stores request, result, engine version, who and when, audited, in `tx`. */
export async function solveAndRecord(
	tx: Executor,
	acting: { workspaceId: string; actorId: string | null },
	subject: Subject,
	request: SolveRequest
): Promise<{ id: string; result: SolveResult }> {
	const result = solve(request);
	const [row] = await tx
		.insert(solves)
		.values({
			workspaceId: acting.workspaceId,
			subjectType: subject.type,
			subjectId: subject.id ?? null,
			subjectVersion: subject.version ?? null,
			kind: request.kind,
			status: result.status,
			rate: result.rate,
			request: request as unknown as Record<string, unknown>,
			result: result as unknown as Record<string, unknown>,
			engineVersion: ENGINE_VERSION,
			createdBy: acting.actorId
		})
		.returning({ id: solves.id });
	await appendAuditEvent(tx, {
		workspaceId: acting.workspaceId,
		actorId: acting.actorId,
		action: 'solve.run',
		subject: `solve:${row.id}`,
		payload: {
			for: subject.id ? `${subject.type}:${subject.id}` : subject.type,
			version: subject.version ?? null,
			kind: request.kind,
			status: result.status,
			rate: result.rate,
			roots: result.roots.length
		}
	});
	return { id: row.id, result };
}

/** A stored solve of this workspace, or null (another workspace's solve is not found). */
export async function getSolve(workspaceId: string, id: string) {
	const [row] = await db
		.select()
		.from(solves)
		.where(and(eq(solves.id, id), eq(solves.workspaceId, workspaceId)));
	return row ?? null;
}
