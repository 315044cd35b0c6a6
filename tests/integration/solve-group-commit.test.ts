import { sql } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import type { SolveRequest } from '$lib/schemas/solve';
import { checkChain } from '$lib/server/audit';
import { db } from '$lib/server/db';
import { solve } from '$lib/server/solver';
import type { SolveRecord } from '$lib/server/solves';
import { storeSolve } from '$lib/server/solves/group-commit';
import { makeMember, makeWorkspace } from '../support/fixtures';

/** An invented two-flow deal: 1000 out, 1100 back a period later (IRR 10%). */
const request = (label: string): SolveRequest =>
	({ kind: 'irr', flows: ['-1000', '1100'], label }) as unknown as SolveRequest;

async function actingIn() {
	const workspace = await makeWorkspace();
	const { user } = await makeMember(workspace.id, 'admin');
	return { workspaceId: workspace.id, actorId: user.id };
}

/** The label rides along in the request (json) and in the result (jsonb). */
function record(acting: SolveRecord['acting'], req: SolveRequest): SolveRecord {
	const { flows, label } = req as unknown as { flows: string[]; label: string };
	const result = { ...solve({ kind: 'irr', flows } as SolveRequest), label };
	return {
		acting,
		subject: { type: 'api', id: null },
		kind: 'irr',
		requestJson: JSON.stringify(req),
		result
	};
}

type Row = { id: string; request: { label: string }; tx: string };

async function storedSolves(workspaceId: string) {
	const result = await db.execute<Row>(sql`
		select id, request, xmin::text as tx from solves where workspace_id = ${workspaceId}`);
	return [...result];
}

async function solveEvents(workspaceId: string) {
	const result = await db.execute<{ subject: string }>(sql`
		select subject from audit_events
		where workspace_id = ${workspaceId} and action = 'solve.run' order by id`);
	return [...result].map((row) => row.subject);
}

describe('group commit of API solves', () => {
	it('stores every concurrent call with its own audited row, in fewer transactions than calls', async () => {
		const [first, second] = await Promise.all([actingIn(), actingIn()]);
		const calls = [
			...Array.from({ length: 40 }, (_, i) => ({ acting: first, label: `a${i}` })),
			...Array.from({ length: 10 }, (_, i) => ({ acting: second, label: `b${i}` }))
		];
		const ids = await Promise.all(
			calls.map(({ acting, label }) => storeSolve(record(acting, request(label))))
		);
		expect(new Set(ids).size).toBe(50);

		for (const [acting, prefix, count] of [
			[first, 'a', 40],
			[second, 'b', 10]
		] as const) {
			const rows = await storedSolves(acting.workspaceId);
			expect(rows).toHaveLength(count);
			// Each id answered belongs to the row holding that call's own request.
			const labelOf = new Map(rows.map((row) => [row.id, row.request.label]));
			calls.forEach(({ label }, i) => {
				if (label.startsWith(prefix)) expect(labelOf.get(ids[i])).toBe(label);
			});
			// One solve.run event per stored solve, and the chain still checks.
			expect((await solveEvents(acting.workspaceId)).sort()).toEqual(
				rows.map((row) => `solve:${row.id}`).sort()
			);
			expect(await checkChain(db, acting.workspaceId)).toEqual({ intact: true, events: count });
		}
		// Rows written by one transaction share its id (xmin): the calls were grouped.
		const transactions = new Set((await storedSolves(first.workspaceId)).map((row) => row.tx));
		expect(transactions.size).toBeGreaterThan(1);
		expect(transactions.size).toBeLessThan(40);
	});

	it('a record the database refuses fails alone; the calls grouped with it are stored', async () => {
		const acting = await actingIn();
		// PostgreSQL's jsonb (the result column) refuses the NUL character (SQLSTATE 22P05).
		const labels = ['fine-1', 'fine-2', 'bad\u0000label', 'fine-3', 'fine-4'];
		const outcomes = await Promise.allSettled(
			labels.map((label) => storeSolve(record(acting, request(label))))
		);
		expect(outcomes.map((o) => o.status)).toEqual([
			'fulfilled',
			'fulfilled',
			'rejected',
			'fulfilled',
			'fulfilled'
		]);
		const rows = await storedSolves(acting.workspaceId);
		expect(rows.map((row) => row.request.label).sort()).toEqual([
			'fine-1',
			'fine-2',
			'fine-3',
			'fine-4'
		]);
		expect(await checkChain(db, acting.workspaceId)).toEqual({ intact: true, events: 4 });
	});
});
