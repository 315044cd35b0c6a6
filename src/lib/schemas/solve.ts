import { z } from 'zod';
import { isRealDate, readIsoDate } from '$lib/calendar';

/*
 * The rate-solving request, shared by forms, the API and the solver. Amounts and rates are
 * decimal strings; rates are fractions (0.0969, not 9.69); dates are YYYY-MM-DD. Everything is
 * validated by refinement (no transforms), so the schema converts cleanly to JSON Schema.
 */

const AMOUNT_PATTERN = /^[+-]?\d{1,24}(\.\d{1,12})?$/;
const RATE_PATTERN = /^[+-]?(\d{1,12}(\.\d{1,40})?|\.\d{1,40})([eE][+-]?\d{1,3})?$/;

export const MAX_FLOWS = 20_000;

/** Exact comparison of two decimal strings matching RATE_PATTERN: negative, zero or positive. */
export function compareDecimalStrings(a: string, b: string): number {
	const parse = (text: string) => {
		const [mantissa, exponent = '0'] = text.toLowerCase().split('e');
		const negative = mantissa.startsWith('-');
		const [whole, fraction = ''] = mantissa.replace(/^[+-]/, '').split('.');
		const digits = BigInt((whole || '0') + fraction);
		return { digits: negative ? -digits : digits, exponent: Number(exponent) - fraction.length };
	};
	const x = parse(a);
	const y = parse(b);
	const floor = Math.min(x.exponent, y.exponent);
	const left = x.digits * 10n ** BigInt(x.exponent - floor);
	const right = y.digits * 10n ** BigInt(y.exponent - floor);
	return left < right ? -1 : left > right ? 1 : 0;
}

function isCalendarDate(text: string): boolean {
	const date = readIsoDate(text);
	return date !== null && date.year >= 1900 && date.year <= 2200 && isRealDate(date);
}

const amount = (what: string) =>
	z
		.string()
		.regex(
			AMOUNT_PATTERN,
			`${what} must be a decimal string such as "-1000" or "33.61" (at most 24 digits before the point and 12 after)`
		);

const nonNegativeAmount = (what: string) =>
	amount(what).refine((text) => !text.startsWith('-'), `${what} must not be negative`);

const rate = (what: string) =>
	z
		.string()
		.regex(RATE_PATTERN, `${what} must be a decimal string such as "0.05" or "1e-12"`)
		.refine(
			(text) => compareDecimalStrings(text, '-1') > 0,
			`${what} must be above -1 (a rate of -100% or less has no meaning)`
		)
		.refine(
			(text) => compareDecimalStrings(text, '1000000') <= 0,
			`${what} must be at most 1000000 (100,000,000% per period)`
		);

const tolerance = (what: string, allowZero: boolean) =>
	z
		.string()
		.regex(RATE_PATTERN, `${what} must be a decimal string such as "1e-12"`)
		.refine(
			(text) =>
				compareDecimalStrings(text, '0') > 0 ||
				(allowZero && compareDecimalStrings(text, '0') === 0),
			`${what} must be ${allowZero ? 'zero or positive' : 'positive'}`
		)
		.refine(
			(text) =>
				compareDecimalStrings(text, '1e-100') >= 0 || compareDecimalStrings(text, '0') === 0,
			`${what} must be at least 1e-100`
		)
		.refine((text) => compareDecimalStrings(text, '1000') <= 0, `${what} must be at most 1000`);

const date = (what: string) =>
	z
		.string()
		.refine(
			isCalendarDate,
			`${what} must be a real calendar date written YYYY-MM-DD (years 1900 to 2200)`
		);

const datedFlow = (what: string, value: z.ZodString | z.ZodType<string>) =>
	z
		.object({
			date: date(`${what} date`).describe('Date of the flow, YYYY-MM-DD.'),
			amount: value.describe('Amount as a decimal string.')
		})
		.strict();

type Dated = { date: string };

/** Adds an issue naming the first date that comes before its predecessor. */
function requireAscending(list: Dated[], field: string, ctx: z.RefinementCtx): void {
	for (let i = 1; i < list.length; i += 1) {
		if (list[i].date < list[i - 1].date) {
			ctx.addIssue({
				code: 'custom',
				path: [field, i, 'date'],
				message: `${field}[${i}].date (${list[i].date}) comes before ${field}[${i - 1}].date (${list[i - 1].date}); dates must be in ascending order`
			});
			return;
		}
	}
}

function requireNotBefore(
	list: Dated[],
	field: string,
	start: string,
	what: string,
	ctx: z.RefinementCtx
): void {
	const index = list.findIndex((item) => item.date < start);
	if (index >= 0) {
		ctx.addIssue({
			code: 'custom',
			path: [field, index, 'date'],
			message: `${field}[${index}].date (${list[index].date}) comes before ${what} (${start})`
		});
	}
}

const common = {
	method: z
		.enum(['bisection', 'itp'])
		.optional()
		.describe(
			'Refinement method: bisection (default) or ITP (interpolate, truncate, project), which never needs more steps than bisection plus one.'
		),
	bracket: z
		.object({
			low: rate('bracket.low').describe(
				'Low end of the rate interval, per period (per year for dated kinds).'
			),
			high: rate('bracket.high').describe('High end of the rate interval, same unit as low.')
		})
		.strict()
		.refine((b) => compareDecimalStrings(b.low, b.high) < 0, {
			message: 'bracket.low must be below bracket.high',
			path: ['low']
		})
		.optional()
		.describe('Rate interval to solve in; without it the engine scans the whole admissible range.'),
	stop: z
		.object({
			rateTolerance: tolerance('stop.rateTolerance', false)
				.optional()
				.describe('Stop when the bracket is narrower than twice this (default 1e-12 per period).'),
			residualTolerance: tolerance('stop.residualTolerance', true)
				.optional()
				.describe('Stop when |NPV| at the latest point is at most this amount.'),
			maxIterations: z
				.number({ error: 'stop.maxIterations must be a whole number from 1 to 1000' })
				.int('stop.maxIterations must be a whole number')
				.min(1, 'stop.maxIterations must be at least 1')
				.max(1000, 'stop.maxIterations must be at most 1000')
				.optional()
				.describe('Iteration cap (default 200); stopping on it early is reported as a warning.'),
			combine: z
				.enum(['any', 'all'])
				.optional()
				.describe('Whether any (default) or all of the chosen tolerance rules must hold.')
		})
		.strict()
		.optional()
		.describe('Stop rules for the decimal refinement.'),
	trace: z.boolean().optional().describe('Include every refinement step in the result.')
};

const listOf = <T extends z.ZodType>(item: T, field: string) =>
	z
		.array(item)
		.min(1, `${field} must list at least one item`)
		.max(MAX_FLOWS, `${field} may list at most ${MAX_FLOWS} items`);

export const irrRequestSchema = z
	.object({
		kind: z.literal('irr'),
		flows: listOf(amount('each flow'), 'flows').describe(
			'Equal-period flows as decimal strings, the first at period 0; negative for money out.'
		),
		periodsPerYear: z
			.number({ error: 'periodsPerYear must be a whole number from 1 to 366' })
			.int('periodsPerYear must be a whole number')
			.min(1, 'periodsPerYear must be at least 1')
			.max(366, 'periodsPerYear must be at most 366')
			.optional()
			.describe('Periods per year (default 1); spaces the root scan evenly per year.'),
		...common
	})
	.strict()
	.describe('IRR of equal-period flows; the rate is per period.');

export const datedIrrRequestSchema = z
	.object({
		kind: z.literal('dated-irr'),
		flows: listOf(datedFlow('each flow', amount('each flow amount')), 'flows').describe(
			'Dated flows in ascending date order; negative for money out.'
		),
		dayCount: z
			.enum(['act/365', 'act/360', 'act/act'])
			.optional()
			.describe('Year fraction basis (default act/365); act/act splits spans at 1 January.'),
		...common
	})
	.strict()
	.superRefine((request, ctx) => requireAscending(request.flows, 'flows', ctx))
	.describe('IRR of dated flows; the rate is effective annual.');

export const aprUsRequestSchema = z
	.object({
		kind: z.literal('apr-us'),
		advances: listOf(
			datedFlow('each advance', nonNegativeAmount('each advance amount')),
			'advances'
		).describe('Advances of the amount financed, ascending by date; the term begins at the first.'),
		payments: listOf(
			datedFlow('each payment', nonNegativeAmount('each payment amount')),
			'payments'
		).describe('Scheduled payments, ascending by date.'),
		...common
	})
	.strict()
	.superRefine((request, ctx) => {
		requireAscending(request.advances, 'advances', ctx);
		requireAscending(request.payments, 'payments', ctx);
		requireNotBefore(
			request.payments,
			'payments',
			request.advances[0].date,
			'the first advance',
			ctx
		);
	})
	.describe('APR by the actuarial method of 12 CFR 1026 Appendix J.');

export const aprcEuRequestSchema = z
	.object({
		kind: z.literal('aprc-eu'),
		drawdowns: listOf(
			datedFlow('each drawdown', nonNegativeAmount('each drawdown amount')),
			'drawdowns'
		).describe('Drawdowns of credit, ascending by date; time is measured from the first.'),
		repayments: listOf(
			datedFlow('each repayment', nonNegativeAmount('each repayment amount')),
			'repayments'
		).describe('Repayments and payments of charges, ascending by date.'),
		timeBasis: z
			.enum(['days', 'periods'])
			.optional()
			.describe(
				'days (default): actual days over 365 (366 in a leap year); periods: whole years, months and weeks counted back from each date, leftover days over 365.'
			),
		...common
	})
	.strict()
	.superRefine((request, ctx) => {
		requireAscending(request.drawdowns, 'drawdowns', ctx);
		requireAscending(request.repayments, 'repayments', ctx);
		requireNotBefore(
			request.repayments,
			'repayments',
			request.drawdowns[0].date,
			'the first drawdown',
			ctx
		);
	})
	.describe('APRC by Directive 2008/48/EC Annex I; the rate is effective annual.');

export const solveRequestSchema = z
	.discriminatedUnion('kind', [
		irrRequestSchema,
		datedIrrRequestSchema,
		aprUsRequestSchema,
		aprcEuRequestSchema
	])
	.describe('A rate to solve: kind selects the equation.');

export type SolveRequest = z.infer<typeof solveRequestSchema>;
export type IrrRequest = z.infer<typeof irrRequestSchema>;
export type DatedIrrRequest = z.infer<typeof datedIrrRequestSchema>;
export type AprUsRequest = z.infer<typeof aprUsRequestSchema>;
export type AprcEuRequest = z.infer<typeof aprcEuRequestSchema>;
export type SolveKind = SolveRequest['kind'];

// ---- Result (plain JSON; every rate a decimal string with its unit stated in rateBasis) ----

export type SolveStatus = 'solved' | 'multiple-roots' | 'no-root';

export type StopReason =
	| 'rate-tolerance'
	| 'residual-tolerance'
	| 'rate-and-residual'
	| 'exact-zero'
	| 'precision-limit'
	| 'iteration-cap'
	| 'no-bracket';

export interface RateInterval {
	low: string;
	high: string;
}

export interface TraceStep {
	/** Index of the root (ascending) this step refines. */
	root: number;
	iteration: number;
	low: string;
	high: string;
	point: string;
	value: string;
}

export interface RootReport {
	/** Headline rate of this root (same unit as the result's rate). */
	rate: string;
	/** Rate per period (irr) or per unit period (apr-us). */
	ratePerPeriod?: string;
	/** Interval of the solved rate (per period, or per year for dated kinds) holding the root. */
	certificate: RateInterval;
	/** NPV at the certificate's ends, of opposite signs. */
	npvAtLow: string;
	npvAtHigh: string;
	/** Proven bound on the distance from the reported rate to the root, in the solved unit. */
	errorBound: string;
	iterations: number;
	predictedIterations: number | null;
	/** ITP only: bisection's count plus n0, which ITP never exceeds. */
	iterationBound?: number;
	stoppedBy: StopReason;
	/** True when a float64 scan narrowed the bracket before the decimal certificate. */
	seeded: boolean;
}

export interface UniquenessResult {
	signChanges: number;
	cumulativeSignChanges: number;
	reverseCumulativeSignChanges: number;
	finalSum: string;
	holds: Array<'descartes' | 'norstrom'>;
	maxRoots: number | null;
	explanation: string;
}

export interface UnitPeriodResult {
	kind: 'day' | 'week' | 'semimonth' | 'month' | 'year' | 'term';
	/** Days, weeks or months per unit period (days or months of the term for kind "term"). */
	count: number;
	label: string;
}

export interface RegularityResult {
	classification: 'regular' | 'irregular';
	/** Accepted distance from the APR, as a fraction: 0.00125 (1/8 point) or 0.0025 (1/4 point). */
	tolerance: string;
	reasons: string[];
}

export interface SolveWarning {
	code: string;
	message: string;
}

export interface NoRootReason {
	code: 'all-zero' | 'one-sign' | 'no-sign-change' | 'bracket-same-sign';
	message: string;
	closest?: { rate: string; npv: string };
}

export interface SolveResult {
	kind: SolveKind;
	status: SolveStatus;
	/** Headline rate or null unless solved; its unit is stated in rateBasis. */
	rate: string | null;
	rateBasis: string;
	ratePerPeriod?: string | null;
	unitPeriod?: UnitPeriodResult;
	unitPeriodsPerYear?: string;
	/** Percent for disclosure, rounded half-up: 2 decimals (apr-us), 1 decimal (aprc-eu). */
	disclosed?: string | null;
	roots: RootReport[];
	iterations: number;
	predictedIterations: number | null;
	stoppedBy: StopReason;
	method: 'bisection' | 'itp';
	uniqueness: UniquenessResult;
	regularity?: RegularityResult;
	reason?: NoRootReason;
	warnings: SolveWarning[];
	scan: { mode: 'light' | 'fine' | 'none'; points: number };
	trace?: TraceStep[];
}
