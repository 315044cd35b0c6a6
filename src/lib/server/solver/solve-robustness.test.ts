import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solveRequestSchema } from '../../schemas/solve';
import { solve } from './solve';

const amount = fc.oneof(
	fc.integer({ min: -2_000_000, max: 2_000_000 }).map((n) => (n / 100).toFixed(2)),
	fc.constantFrom('0', '-0', '1', '-1', '999999999999999999999999.5', '-0.000000000001')
);
const sortedDates = (count: number, from: number, to: number) =>
	fc
		.array(fc.integer({ min: from, max: to }), { minLength: count, maxLength: count })
		.map((offsets) =>
			offsets
				.sort((a, b) => a - b)
				.map((offset) => new Date(Date.UTC(1990, 0, 1 + offset)).toISOString().slice(0, 10))
		);
const dated = (amounts: fc.Arbitrary<string>, min: number, max: number, from = 0, to = 15_000) =>
	fc
		.integer({ min, max })
		.chain((count) =>
			fc.tuple(
				sortedDates(count, from, to),
				fc.array(amounts, { minLength: count, maxLength: count })
			)
		)
		.map(([dates, values]) => dates.map((date, k) => ({ date, amount: values[k] })));
const positive = amount.map((a) => a.replace('-', ''));

const common = fc.record(
	{
		method: fc.constantFrom('bisection', 'itp'),
		bracket: fc.record({
			low: fc.constantFrom('-0.999', '-0.5', '0', '0.1', '-1e-3'),
			high: fc.constantFrom('0.05', '1', '10', '1000000', '2.5e2')
		}),
		stop: fc.record(
			{
				rateTolerance: fc.constantFrom('1e-12', '0.001', '1e-40', '0.5'),
				residualTolerance: fc.constantFrom('0', '1e-6', '1000'),
				maxIterations: fc.integer({ min: 1, max: 300 }),
				combine: fc.constantFrom('any', 'all')
			},
			{ requiredKeys: [] }
		),
		trace: fc.boolean()
	},
	{ requiredKeys: [] }
);

const request = fc.oneof(
	fc.record({
		kind: fc.constant('irr'),
		flows: fc.array(amount, { minLength: 1, maxLength: 8 }),
		periodsPerYear: fc.constantFrom(1, 4, 12, 52, 365)
	}),
	fc.record({
		kind: fc.constant('dated-irr'),
		flows: dated(amount, 1, 6),
		dayCount: fc.constantFrom('act/365', 'act/360', 'act/act')
	}),
	fc.record({
		kind: fc.constant('apr-us'),
		advances: dated(positive, 1, 3, 0, 400),
		payments: dated(positive, 1, 8, 0, 12_000)
	}),
	fc.record({
		kind: fc.constant('aprc-eu'),
		drawdowns: dated(positive, 1, 3, 0, 400),
		repayments: dated(positive, 1, 6, 0, 12_000),
		timeBasis: fc.constantFrom('days', 'periods')
	})
);

describe('solve on any schema-valid input', () => {
	it('returns a JSON-serialisable result and never throws (property)', () => {
		let checked = 0;
		fc.assert(
			fc.property(request, common, (body, options) => {
				const parsed = solveRequestSchema.safeParse({ ...body, ...options });
				if (!parsed.success) return true;
				checked += 1;
				const result = solve(parsed.data);
				const copy = JSON.parse(JSON.stringify(result));
				const statusOk = ['solved', 'multiple-roots', 'no-root'].includes(copy.status);
				const rateOk = (copy.status === 'solved') === (copy.rate !== null);
				const reasonOk = copy.status !== 'no-root' || typeof copy.reason?.message === 'string';
				return statusOk && rateOk && reasonOk;
			}),
			{ numRuns: 80 }
		);
		expect(checked).toBeGreaterThan(20);
	});
});
