import { randomUUID } from 'node:crypto';
import { and, eq, sql } from 'drizzle-orm';
import type { SolveRequest, SolveResult } from '$lib/schemas/solve';
import { appendAuditEvents } from '../audit/chain';
import { db } from '../db';
import { solves } from '../db/schema';
import type { Executor } from '../db/types';
import { solve } from '../solver';
import { appVersion } from '../version';

/** Stored with every solve so that an examiner can tell which engine produced a result. */
export const ENGINE_VERSION = `pincer ${appVersion} (decimal.js 10.6.0, 40 digits)`;

export type Subject = {
	type: 'loan' | 'deal' | 'api';
	id?: string | null;
	version?: number | null;
};
export type Acting = { workspaceId: string; actorId: string | null };

/** One engine run to store: who asked, what for, the request and the engine's result. */
export type SolveRecord = {
	acting: Acting;
	subject: Subject;
	kind: SolveRequest['kind'];
	/**
	 * The request as JSON text, stored as it is: serialised, or the body an API caller sent
	 * (valid for the request schema, which has no transforms or defaults, so it holds the same
	 * request). Keeping text rather than objects keeps a waiting call's memory small.
	 */
	requestJson: string;
	result: SolveResult;
};

/** Runs the engine and stores request, result, engine version, who and when, audited, in `tx`. */
export async function solveAndRecord(
	tx: Executor,
	acting: Acting,
	subject: Subject,
	request: SolveRequest
): Promise<{ id: string; result: SolveResult }> {
	const result = solve(request);
	const [id] = await recordSolves(tx, acting.workspaceId, [
		{ acting, subject, kind: request.kind, requestJson: JSON.stringify(request), result }
	]);
	return { id, result };
}

/**
 * Stores solves of one workspace in `tx`, each with its solve.run event in the workspace's audit
 * chain (in the order given); their ids in the same order.
 */
export async function recordSolves(
	tx: Executor,
	workspaceId: string,
	records: SolveRecord[]
): Promise<string[]> {
	if (records.length === 0) return [];
	const ids = records.map(() => randomUUID());
	const stored = tx.insert(solves).values(
		records.map(({ acting, subject, kind, requestJson, result }, i) => ({
			id: ids[i],
			workspaceId: acting.workspaceId,
			subjectType: subject.type,
			subjectId: subject.id ?? null,
			subjectVersion: subject.version ?? null,
			kind,
			status: result.status,
			rate: result.rate,
			request: sql`${requestJson}::json`,
			result: result as unknown as Record<string, unknown>,
			engineVersion: ENGINE_VERSION,
			createdBy: acting.actorId
		}))
	);
	// One statement, so one round trip and atomic even outside a transaction: the solve rows
	// are inserted by a data-modifying WITH, the events by the chain's append function.
	const events = await appendAuditEvents(
		tx,
		workspaceId,
		records.map(({ acting, subject, kind, result }, i) => ({
			workspaceId: acting.workspaceId,
			actorId: acting.actorId,
			action: 'solve.run',
			subject: `solve:${ids[i]}`,
			payload: {
				for: subject.id ? `${subject.type}:${subject.id}` : subject.type,
				version: subject.version ?? null,
				kind,
				status: result.status,
				rate: result.rate,
				roots: result.roots.length
			}
		})),
		stored
	);
	if (events.length !== ids.length) throw new Error('recordSolves: an audit event is missing');
	return ids;
}

/** A stored solve of this workspace, or null (another workspace's solve is not found). */
export async function getSolve(workspaceId: string, id: string) {
	const [row] = await db
		.select()
		.from(solves)
		.where(and(eq(solves.id, id), eq(solves.workspaceId, workspaceId)));
	return row ?? null;
}
