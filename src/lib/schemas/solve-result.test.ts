import { describe, expect, it } from 'vitest';
import { solve } from '../server/solver';
import type { SolveRequest } from './solve';
import { solveResultSchema } from './solve-result';

// Invented inputs, one per kind and outcome, so every optional part of a result appears.
const requests: SolveRequest[] = [
	{ kind: 'irr', flows: ['-1000', '300', '400', '500'], trace: true },
	{ kind: 'irr', flows: ['-1600', '10000', '-10000'] },
	{ kind: 'irr', flows: ['100', '200'] },
	{
		kind: 'dated-irr',
		flows: [
			{ date: '2026-01-15', amount: '-250000' },
			{ date: '2026-07-15', amount: '40000' },
			{ date: '2028-01-15', amount: '250000' }
		],
		method: 'itp'
	},
	{
		kind: 'apr-us',
		advances: [{ date: '2026-01-10', amount: '1000' }],
		payments: [
			{ date: '2026-03-01', amount: '520' },
			{ date: '2026-04-01', amount: '520' }
		]
	},
	{
		kind: 'aprc-eu',
		drawdowns: [{ date: '2026-01-01', amount: '1000' }],
		repayments: [{ date: '2027-01-01', amount: '1100' }],
		bracket: { low: '0.5', high: '0.9' }
	}
];

describe('solveResultSchema', () => {
	it.each(requests.map((r, i) => [i, r] as const))(
		'describes the engine result of request %i exactly (strict parse)',
		(_, request) => {
			const result = JSON.parse(JSON.stringify(solve(request)));
			const parsed = solveResultSchema.safeParse(result);
			expect(parsed.error?.issues ?? []).toEqual([]);
		}
	);

	it('covers solved, several-root and no-root outcomes', () => {
		const statuses = new Set(requests.map((r) => solve(r).status));
		expect([...statuses].sort()).toEqual(['multiple-roots', 'no-root', 'solved']);
	});

	it('refuses a field the engine does not produce (so drift is caught)', () => {
		const result = { ...JSON.parse(JSON.stringify(solve(requests[0]))), extra: 1 };
		expect(solveResultSchema.safeParse(result).success).toBe(false);
	});
});
