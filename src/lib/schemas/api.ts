// Schemas of the REST API v1 boundary, built from the same schemas the screens validate with.
// Every input object is strict: a field the API does not know is refused, not ignored.
// Responses are described here too so that the OpenAPI document covers both directions.
import { z } from 'zod';
import { auditFilterSchema } from './audit';
import { dealContentSchema, dealCreateSchema, dealFlowSchema } from './deal';
import { loanListQuerySchema } from './lists';
import { loanTermsSchema, scheduleRowSchema } from './loan';
import { solveRequestSchema } from './solve';
import { solveResultSchema } from './solve-result';

// ---- API keys (the settings form) ----

export const apiKeyCreateSchema = z.object({
	name: z
		.string()
		.trim()
		.min(1, { error: 'Name the key after the system that will use it.' })
		.max(80, { error: 'Use at most 80 characters.' }),
	scope: z.enum(['officer', 'analyst', 'reviewer'], { error: 'Choose the scope.' })
});

export const apiKeyIdSchema = z.object({ keyId: z.uuid() });

// ---- Inputs ----

const terms = loanTermsSchema.strict();
const header = z
	.object({
		reference: loanTermsSchema.shape.reference,
		borrowerName: loanTermsSchema.shape.borrowerName,
		regime: loanTermsSchema.shape.regime,
		securedByRealProperty: loanTermsSchema.shape.securedByRealProperty
	})
	.strict();

/** A loan file as the API accepts it: the Terms form, or a header with schedule rows. */
export const loanInputSchema = z
	.discriminatedUnion('entryMode', [
		z
			.object({
				entryMode: z.literal('terms'),
				terms: terms.describe(
					'The Terms form: note rate is a percent per year ("7.25"); money has at most two decimals; fees are three lists of equal length (feeName, feeAmount, feeKind).'
				)
			})
			.strict(),
		z
			.object({
				entryMode: z.literal('schedule'),
				header,
				rows: z
					.array(scheduleRowSchema.strict())
					.min(2, { error: 'List at least one advance and one payment.' })
					.max(20_000)
					.describe('Advances and payments with their dates; amounts above zero.')
			})
			.strict()
	])
	.describe('A loan file: its terms, or its schedule entered row by row.');
export type LoanInput = z.output<typeof loanInputSchema>;

/** A deal as the API accepts it: its name and its cash flows with the analysis settings. */
export const dealInputSchema = z
	.object({
		name: dealCreateSchema.shape.name,
		content: dealContentSchema
			.safeExtend({
				flows: z
					.array(dealFlowSchema.strict())
					.max(100_000)
					.describe('Cash flows: date (dated mode) or period (periodic mode), amount, label.')
			})
			.strict()
			.describe(
				'Flows and settings; rates are percents per year ("8" is 8%), amounts decimal strings.'
			)
	})
	.strict();
export type DealInput = z.output<typeof dealInputSchema>;

export const dealListParamsSchema = z
	.object({
		q: z.string().trim().max(100).optional().describe('Part of the deal name'),
		sort: z.enum(['updated', 'name', 'solved']).default('updated'),
		page: z.coerce.number().int().min(1).max(100_000).default(1)
	})
	.strict();
export const dealVersionParamsSchema = z
	.object({
		version: z.coerce
			.number()
			.int()
			.min(1)
			.optional()
			.describe('A past version; the current one when omitted.')
	})
	.strict();

export const loanListParamsSchema = loanListQuerySchema.strict();
export const loanVersionParamsSchema = z
	.object({
		version: z.coerce
			.number()
			.int()
			.min(1)
			.optional()
			.describe('A past version; the current one when omitted.')
	})
	.strict();
export const auditParamsSchema = auditFilterSchema.strict();
export const noParamsSchema = z.object({}).strict();
export { solveRequestSchema, solveResultSchema };

// ---- Responses ----

const timestamp = z.iso.datetime({ offset: true }).describe('ISO 8601 timestamp');
const money = z.string().describe('Amount (decimal string, two decimals)');

export const storedSolveSchema = z
	.object({
		id: z.uuid(),
		kind: z.enum(['irr', 'dated-irr', 'apr-us', 'aprc-eu']),
		status: z.enum(['solved', 'multiple-roots', 'no-root']),
		rate: z.string().nullable().describe('Headline rate as a fraction (unit in result.rateBasis).'),
		subject: z
			.object({
				type: z.enum(['loan', 'deal', 'api']),
				id: z
					.uuid()
					.nullable()
					.describe('The loan or deal; for API solves the key that asked (null when signed in).'),
				version: z.number().int().nullable()
			})
			.strict(),
		engineVersion: z.string(),
		createdAt: timestamp,
		request: solveRequestSchema,
		result: solveResultSchema
	})
	.strict()
	.describe('A stored solve: the exact request, the result and the engine that produced it.');

export const solveCreatedSchema = z
	.object({ id: z.uuid().describe('Id of the stored solve (GET /solves/{id}).') })
	.extend(solveResultSchema.shape)
	.strict()
	.describe('The engine result, with the id under which the solve was stored.');

const loanSummary = z
	.object({
		id: z.uuid(),
		reference: z.string(),
		borrowerName: z.string(),
		regime: z.enum(['us-apr', 'eu-aprc']),
		status: z.enum(['draft', 'disclosed']),
		version: z.number().int(),
		amountFinanced: money.nullable(),
		rate: z.string().nullable().describe('Solved APR or APRC as an annual fraction.'),
		solveStatus: z.enum(['solved', 'multiple-roots', 'no-root']).nullable(),
		updatedAt: timestamp
	})
	.strict();

const page = {
	page: z.number().int(),
	pages: z.number().int(),
	pageSize: z.number().int(),
	total: z.number().int()
};

export const loanListSchema = z.object({ items: z.array(loanSummary), ...page }).strict();

export const loanSchema = z
	.object({
		id: z.uuid(),
		reference: z.string(),
		borrowerName: z.string(),
		regime: z.enum(['us-apr', 'eu-aprc']),
		status: z.enum(['draft', 'disclosed']),
		version: z.number().int().describe('The version shown.'),
		currentVersion: z.number().int(),
		disclosedVersion: z.number().int().nullable(),
		createdAt: timestamp,
		updatedAt: timestamp,
		file: loanInputSchema.describe('The loan file of this version, as entered.'),
		figures: z
			.object({ amountFinanced: money, financeCharge: money, totalOfPayments: money })
			.strict(),
		changes: z.array(z.string()).describe('What changed from the previous version.'),
		solve: storedSolveSchema.nullable()
	})
	.strict();

const dealSummary = z
	.object({
		id: z.uuid(),
		name: z.string(),
		scenarioOf: z.uuid().nullable().describe('The base deal when this deal is a scenario of it.'),
		version: z.number().int(),
		kind: z.enum(['irr', 'dated-irr']).nullable(),
		status: z.enum(['solved', 'multiple-roots', 'no-root']).nullable(),
		rate: z.string().nullable().describe('Headline rate of the latest solve (unit per kind).'),
		updatedAt: timestamp,
		lastSolvedAt: timestamp.nullable()
	})
	.strict();

export const dealListSchema = z.object({ items: z.array(dealSummary), ...page }).strict();

export const dealSchema = z
	.object({
		id: z.uuid(),
		name: z.string(),
		scenarioOf: z.uuid().nullable(),
		version: z.number().int().describe('The version shown.'),
		currentVersion: z.number().int(),
		createdAt: timestamp,
		updatedAt: timestamp,
		content: dealContentSchema.describe('Flows and settings of this version.'),
		solve: storedSolveSchema.nullable().describe('The latest solve of the deal.')
	})
	.strict();

export const auditPageSchema = z
	.object({
		items: z.array(
			z
				.object({
					id: z.number().int(),
					at: timestamp,
					action: z.string().describe('domain.verb, e.g. loan.create, api.call'),
					subject: z.string().nullable(),
					actor: z.object({ email: z.string(), name: z.string().nullable() }).strict().nullable(),
					payload: z.record(z.string(), z.unknown()),
					hash: z.string().nullable().describe('SHA-256 chaining this event to the one before it.')
				})
				.strict()
		),
		...page
	})
	.strict();

export const apiErrorSchema = z
	.object({
		error: z
			.object({
				code: z.enum([
					'unauthenticated',
					'forbidden',
					'not_found',
					'malformed_json',
					'invalid_query',
					'validation_failed',
					'unsupported_media_type',
					'payload_too_large',
					'conflict',
					'rate_limited',
					'internal_error'
				]),
				message: z.string(),
				fields: z
					.record(z.string(), z.array(z.string()))
					.optional()
					.describe('Problems by field path such as "payments.3.date" ("" is the whole body).'),
				requestId: z.string().optional()
			})
			.strict()
	})
	.strict();
