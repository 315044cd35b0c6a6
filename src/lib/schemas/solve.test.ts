import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { compareDecimalStrings, solveRequestSchema } from './solve';

const messages = (input: unknown) => {
	const parsed = solveRequestSchema.safeParse(input);
	return parsed.success
		? []
		: parsed.error.issues.map((issue) => `${issue.path.join('.')}: ${issue.message}`);
};

describe('solveRequestSchema', () => {
	it('accepts one request of each kind', () => {
		const ok = [
			{ kind: 'irr', flows: ['-1000', '300', '800'], periodsPerYear: 12 },
			{
				kind: 'dated-irr',
				flows: [
					{ date: '2024-01-01', amount: '-10' },
					{ date: '2024-01-01', amount: '-5' },
					{ date: '2025-02-01', amount: '17' }
				],
				dayCount: 'act/act'
			},
			{
				kind: 'apr-us',
				advances: [{ date: '2024-01-10', amount: '5000' }],
				payments: [{ date: '2024-02-10', amount: '230' }],
				method: 'itp',
				bracket: { low: '0', high: '0.1' },
				stop: { rateTolerance: '1e-12', maxIterations: 50, combine: 'all', residualTolerance: '0' },
				trace: true
			},
			{
				kind: 'aprc-eu',
				drawdowns: [{ date: '1994-01-01', amount: '1000' }],
				repayments: [{ date: '1995-07-01', amount: '1200' }],
				timeBasis: 'periods'
			}
		];
		for (const request of ok) expect(messages(request)).toEqual([]);
		// The API stores a solve's body as it came (api/solves.ts): that is only the request
		// validated if parsing adds nothing and changes nothing (no defaults, no transforms).
		const bare = [
			{ kind: 'irr', flows: ['-1000', '1100'] },
			{ kind: 'dated-irr', flows: [{ date: '2024-01-01', amount: '-10' }] },
			{ kind: 'apr-us', advances: ok[2].advances, payments: ok[2].payments },
			{ kind: 'aprc-eu', drawdowns: ok[3].drawdowns, repayments: ok[3].repayments }
		];
		for (const request of [...ok, ...bare]) {
			expect(solveRequestSchema.parse(request)).toStrictEqual(request);
		}
	});

	it('rejects empty flows, naming the field', () => {
		expect(messages({ kind: 'irr', flows: [] })).toEqual([
			'flows: flows must list at least one item'
		]);
	});

	it('rejects non-numeric amounts', () => {
		expect(messages({ kind: 'irr', flows: ['-1000', '12a'] })[0]).toMatch(
			/^flows\.1: each flow must be a decimal string/
		);
		expect(messages({ kind: 'irr', flows: ['1e3'] })[0]).toMatch(
			/each flow must be a decimal string/
		);
	});

	it('rejects unsorted and invalid dates', () => {
		const unsorted = messages({
			kind: 'dated-irr',
			flows: [
				{ date: '2024-03-01', amount: '-1' },
				{ date: '2024-02-01', amount: '2' }
			]
		});
		expect(unsorted).toEqual([
			'flows.1.date: flows[1].date (2024-02-01) comes before flows[0].date (2024-03-01); dates must be in ascending order'
		]);
		const invalid = messages({ kind: 'dated-irr', flows: [{ date: '2023-02-29', amount: '-1' }] });
		expect(invalid[0]).toMatch(/^flows\.0\.date: each flow date must be a real calendar date/);
	});

	it('rejects payments before the first advance', () => {
		const early = messages({
			kind: 'apr-us',
			advances: [{ date: '2024-01-10', amount: '1000' }],
			payments: [{ date: '2024-01-09', amount: '1010' }]
		});
		expect(early).toEqual([
			'payments.0.date: payments[0].date (2024-01-09) comes before the first advance (2024-01-10)'
		]);
	});

	it('rejects a bracket with low ≥ high, and rates of −100% or less', () => {
		const base = { kind: 'irr', flows: ['-1', '2'] };
		expect(messages({ ...base, bracket: { low: '0.5', high: '0.50' } })).toEqual([
			'bracket.low: bracket.low must be below bracket.high'
		]);
		expect(messages({ ...base, bracket: { low: '-1', high: '1' } })[0]).toMatch(
			/^bracket\.low: bracket\.low must be above -1/
		);
		expect(messages({ ...base, bracket: { low: '-1.5e0', high: '1' } })[0]).toMatch(
			/must be above -1/
		);
	});

	it('rejects bad stop rules and unknown fields', () => {
		const base = { kind: 'irr', flows: ['-1', '2'] };
		expect(messages({ ...base, stop: { rateTolerance: '0' } })).toEqual([
			'stop.rateTolerance: stop.rateTolerance must be positive'
		]);
		expect(messages({ ...base, stop: { maxIterations: 2.5 } })[0]).toMatch(
			/stop\.maxIterations must be a whole number/
		);
		expect(messages({ ...base, colour: 'brass' }).length).toBe(1);
		expect(messages({ kind: 'loan', flows: ['1'] }).length).toBe(1);
	});

	it('compares decimal strings exactly', () => {
		expect(compareDecimalStrings('0.1000000000000000000001', '0.1')).toBe(1);
		expect(compareDecimalStrings('-1', '-1.000')).toBe(0);
		expect(compareDecimalStrings('2.5e2', '250.0000001')).toBe(-1);
		expect(compareDecimalStrings('.5', '0.4999')).toBe(1);
	});

	it('converts to JSON Schema with descriptions', () => {
		const schema = z.toJSONSchema(solveRequestSchema) as {
			description?: string;
			oneOf?: unknown[];
			anyOf?: unknown[];
		};
		expect(schema.description).toMatch(/kind selects the equation/);
		expect((schema.oneOf ?? schema.anyOf ?? []).length).toBe(4);
		expect(JSON.stringify(schema)).toContain('Dated flows in ascending date order');
	});
});
