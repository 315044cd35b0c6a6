// The engine's result as a zod schema, for the OpenAPI document and the API reference. It mirrors
// the SolveResult interface of ./solve; the type checks at the bottom fail the build when the two
// drift apart, and solve-result.test.ts parses real results of every kind with it.
import { z } from 'zod';
import type { SolveResult } from './solve';

const decimal = (what: string) => z.string().describe(`${what} (decimal string)`);

const stopReason = z
	.enum([
		'rate-tolerance',
		'residual-tolerance',
		'rate-and-residual',
		'exact-zero',
		'precision-limit',
		'iteration-cap',
		'no-bracket'
	])
	.describe('Which stop rule ended the refinement.');

const interval = z.object({ low: z.string(), high: z.string() }).strict();

const rootReport = z
	.object({
		rate: decimal('Headline rate of this root, same unit as the result rate'),
		ratePerPeriod: decimal('Rate per period (irr) or per unit period (apr-us)').optional(),
		certificate: interval.describe(
			'Interval of the solved rate whose ends were evaluated and have opposite NPV signs.'
		),
		npvAtLow: decimal('NPV at the certificate low end'),
		npvAtHigh: decimal('NPV at the certificate high end'),
		errorBound: decimal('Proven bound on the distance from the rate to the root'),
		iterations: z.number().int(),
		predictedIterations: z.number().int().nullable(),
		iterationBound: z.number().int().optional().describe('ITP only: the worst-case step count.'),
		stoppedBy: stopReason,
		seeded: z.boolean().describe('True when a float64 scan narrowed the bracket first.')
	})
	.strict();

const uniqueness = z
	.object({
		signChanges: z.number().int(),
		cumulativeSignChanges: z.number().int(),
		reverseCumulativeSignChanges: z.number().int(),
		finalSum: z.string(),
		holds: z.array(z.enum(['descartes', 'norstrom'])),
		maxRoots: z.number().int().nullable(),
		explanation: z.string()
	})
	.strict()
	.describe('What the sign rules say about how many rates can exist.');

const unitPeriod = z
	.object({
		kind: z.enum(['day', 'week', 'semimonth', 'month', 'year', 'term']),
		count: z.number(),
		label: z.string()
	})
	.strict();

const regularity = z
	.object({
		classification: z.enum(['regular', 'irregular']),
		tolerance: decimal('Accepted distance from the APR as a fraction'),
		reasons: z.array(z.string())
	})
	.strict();

const warning = z.object({ code: z.string(), message: z.string() }).strict();

const noRootReason = z
	.object({
		code: z.enum(['all-zero', 'one-sign', 'no-sign-change', 'bracket-same-sign']),
		message: z.string(),
		closest: z.object({ rate: z.string(), npv: z.string() }).strict().optional()
	})
	.strict();

const traceStep = z
	.object({
		root: z.number().int(),
		iteration: z.number().int(),
		low: z.string(),
		high: z.string(),
		point: z.string(),
		value: z.string()
	})
	.strict();

export const solveResultSchema = z
	.object({
		kind: z.enum(['irr', 'dated-irr', 'apr-us', 'aprc-eu']),
		status: z.enum(['solved', 'multiple-roots', 'no-root']),
		rate: decimal('Headline rate as a fraction; null unless exactly one root').nullable(),
		rateBasis: z.string().describe('The unit of rate, in words.'),
		ratePerPeriod: z.string().nullable().optional(),
		unitPeriod: unitPeriod.optional(),
		unitPeriodsPerYear: z.string().optional(),
		disclosed: z
			.string()
			.nullable()
			.optional()
			.describe('Percent for disclosure, rounded half-up: 2 decimals (apr-us), 1 (aprc-eu).'),
		roots: z.array(rootReport),
		iterations: z.number().int(),
		predictedIterations: z.number().int().nullable(),
		stoppedBy: stopReason,
		method: z.enum(['bisection', 'itp']),
		uniqueness,
		regularity: regularity.optional(),
		reason: noRootReason.optional().describe('Why no rate exists (status no-root).'),
		warnings: z.array(warning),
		scan: z.object({ mode: z.enum(['light', 'fine', 'none']), points: z.number().int() }).strict(),
		trace: z.array(traceStep).optional()
	})
	.strict()
	.describe('Every rate found, each with a certificate interval, or the reason there is none.');

// Compile-time proof that the schema and the engine's interface describe the same object.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const resultMatches: Same<z.infer<typeof solveResultSchema>, SolveResult> = true;
void resultMatches;
