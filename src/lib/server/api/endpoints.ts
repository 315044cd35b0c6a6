// The catalogue of REST API v1: one entry per operation with its roles, schemas and example.
// Route handlers read their roles and schemas from here and the OpenAPI document is generated
// from it, so what is documented is what is enforced.
import type { z } from 'zod';
import {
	auditPageSchema,
	auditParamsSchema,
	dealInputSchema,
	dealListParamsSchema,
	dealListSchema,
	dealSchema,
	dealVersionParamsSchema,
	loanInputSchema,
	loanListParamsSchema,
	loanListSchema,
	loanSchema,
	loanVersionParamsSchema,
	solveCreatedSchema,
	solveRequestSchema,
	storedSolveSchema
} from '$lib/schemas/api';
import { writers } from '../auth/guards';
import type { Role } from '../db/schema';

export type Named = { name: string; schema: z.ZodType };

export type Endpoint = {
	operationId: string;
	method: 'GET' | 'POST' | 'PUT';
	/** Path below /api/v1, with {name} for path parameters. */
	path: string;
	tag: string;
	summary: string;
	description: string;
	/** Roles allowed (a key's scope or a signed-in member's role); empty means every role. */
	roles: Role[];
	pathParams?: { name: string; description: string }[];
	query?: z.ZodObject;
	body?: Named;
	/** An example request: query string and/or JSON body. */
	example: { query?: string; body?: unknown };
	success: { status: 200 | 201; description: string } & Named;
	/** Error statuses beyond the ones every operation can answer (401, 403, 429, 500). */
	errors: number[];
};

const readers: Role[] = [];
const solvers: Role[] = ['admin', 'officer', 'analyst'];

const loanTermsExample = {
	entryMode: 'terms',
	terms: {
		reference: 'API-0001',
		borrowerName: 'Tamsin Orchardley',
		regime: 'us-apr',
		amountOfCredit: '12500.00',
		noteRate: '7.25',
		numberOfPayments: 48,
		frequency: 'monthly',
		advanceDate: '2026-03-02',
		firstPaymentDate: '2026-04-02',
		feeName: ['Origination fee'],
		feeAmount: ['150.00'],
		feeKind: ['finance-charge-cash']
	}
};

const scheduleRows = [
	{ kind: 'advance', date: '2026-03-02', amount: '5000.00' },
	...['04', '05', '06', '07', '08', '09'].map((month) => ({
		kind: 'payment',
		date: `2026-${month}-02`,
		amount: '850.00'
	}))
];

const dealExample = {
	name: 'Saltmarsh Cold Store',
	content: {
		mode: 'dated',
		flows: [
			{ date: '2026-02-01', amount: '-480000', label: 'Purchase and fit-out' },
			{ date: '2026-12-31', amount: '62000', label: 'Rent, year 1' },
			{ date: '2027-12-31', amount: '64000', label: 'Rent, year 2' },
			{ date: '2028-12-31', amount: '535000', label: 'Rent and sale' }
		]
	}
};

export const endpoints = {
	solve: {
		operationId: 'solveRate',
		method: 'POST',
		path: '/solve',
		tag: 'Rates',
		summary: 'Solve a rate',
		description:
			'Runs the rate engine on the request exactly as the screens do: it brackets every sign change of the present-value equation, refines each root in decimal arithmetic and returns every rate found with its certificate interval, or the reason none exists. The request and result are stored with the engine version and audited (solve.run).',
		roles: solvers,
		body: { name: 'SolveRequest', schema: solveRequestSchema },
		example: {
			body: {
				kind: 'dated-irr',
				flows: [
					{ date: '2026-01-15', amount: '-250000' },
					{ date: '2026-07-15', amount: '40000' },
					{ date: '2027-03-01', amount: '120000' },
					{ date: '2028-01-15', amount: '130000' }
				]
			}
		},
		success: {
			status: 200,
			description: 'The result.',
			name: 'SolveCreated',
			schema: solveCreatedSchema
		},
		errors: [400, 413, 415, 422]
	},
	getSolve: {
		operationId: 'getSolve',
		method: 'GET',
		path: '/solves/{solveId}',
		tag: 'Rates',
		summary: 'Read a stored solve',
		description:
			'Any solve of the workspace (from the API, a loan file or a deal) with its exact request, result, engine version and subject.',
		roles: readers,
		pathParams: [
			{ name: 'solveId', description: 'Id returned by POST /solve or shown with a loan.' }
		],
		example: {},
		success: {
			status: 200,
			description: 'The stored solve.',
			name: 'StoredSolve',
			schema: storedSolveSchema
		},
		errors: [404]
	},
	listLoans: {
		operationId: 'listLoans',
		method: 'GET',
		path: '/loans',
		tag: 'Loans',
		summary: 'List loan files',
		description:
			'Loan files of the workspace, 25 a page, with their current amount financed and solved rate.',
		roles: readers,
		query: loanListParamsSchema,
		example: { query: 'sort=reference&page=1' },
		success: {
			status: 200,
			description: 'One page of loans.',
			name: 'LoanList',
			schema: loanListSchema
		},
		errors: [400]
	},
	createLoan: {
		operationId: 'createLoan',
		method: 'POST',
		path: '/loans',
		tag: 'Loans',
		summary: 'Create a loan file',
		description:
			'Creates a loan file with its first version and solves its APR (Appendix J) or APRC (Annex I). The answer carries the stored loan; its Location header points to it.',
		roles: writers.loans,
		body: { name: 'LoanInput', schema: loanInputSchema },
		example: { body: loanTermsExample },
		success: { status: 201, description: 'The new loan.', name: 'Loan', schema: loanSchema },
		errors: [400, 409, 413, 415, 422]
	},
	getLoan: {
		operationId: 'getLoan',
		method: 'GET',
		path: '/loans/{loanId}',
		tag: 'Loans',
		summary: 'Read a loan file',
		description: 'A loan file with the entered terms or schedule, its figures and its solve.',
		roles: readers,
		pathParams: [{ name: 'loanId', description: 'Id of the loan file.' }],
		query: loanVersionParamsSchema,
		example: {},
		success: { status: 200, description: 'The loan.', name: 'Loan', schema: loanSchema },
		errors: [400, 404]
	},
	updateLoan: {
		operationId: 'updateLoan',
		method: 'PUT',
		path: '/loans/{loanId}',
		tag: 'Loans',
		summary: 'Save a new version of a loan file',
		description:
			'Stores the body as the next version (versions are never overwritten) and solves it again. A disclosed loan returns to draft until it is disclosed again on its screen.',
		roles: writers.loans,
		pathParams: [{ name: 'loanId', description: 'Id of the loan file.' }],
		body: { name: 'LoanInput', schema: loanInputSchema },
		example: {
			body: {
				entryMode: 'schedule',
				header: { reference: 'API-0001', borrowerName: 'Tamsin Orchardley', regime: 'us-apr' },
				rows: scheduleRows
			}
		},
		success: {
			status: 200,
			description: 'The loan at its new version.',
			name: 'Loan',
			schema: loanSchema
		},
		errors: [400, 404, 409, 413, 415, 422]
	},
	listDeals: {
		operationId: 'listDeals',
		method: 'GET',
		path: '/deals',
		tag: 'Deals',
		summary: 'List deals',
		description:
			'Deals and scenarios of the workspace, 25 a page, with the headline rate of their latest solve.',
		roles: readers,
		query: dealListParamsSchema,
		example: { query: 'sort=name&page=1' },
		success: {
			status: 200,
			description: 'One page of deals.',
			name: 'DealList',
			schema: dealListSchema
		},
		errors: [400]
	},
	createDeal: {
		operationId: 'createDeal',
		method: 'POST',
		path: '/deals',
		tag: 'Deals',
		summary: 'Create a deal',
		description:
			'Creates a deal with its first version and solves its IRR (dated flows: effective annual; equal periods: per period), reporting every rate when the flows change sign more than once.',
		roles: writers.deals,
		body: { name: 'DealInput', schema: dealInputSchema },
		example: { body: dealExample },
		success: { status: 201, description: 'The new deal.', name: 'Deal', schema: dealSchema },
		errors: [400, 413, 415, 422]
	},
	getDeal: {
		operationId: 'getDeal',
		method: 'GET',
		path: '/deals/{dealId}',
		tag: 'Deals',
		summary: 'Read a deal',
		description: 'A deal with the flows and settings of a version and its latest solve.',
		roles: readers,
		pathParams: [{ name: 'dealId', description: 'Id of the deal.' }],
		query: dealVersionParamsSchema,
		example: {},
		success: { status: 200, description: 'The deal.', name: 'Deal', schema: dealSchema },
		errors: [400, 404]
	},
	updateDeal: {
		operationId: 'updateDeal',
		method: 'PUT',
		path: '/deals/{dealId}',
		tag: 'Deals',
		summary: 'Save a new version of a deal',
		description:
			'Stores the body as the next version (versions are never overwritten) and solves it again.',
		roles: writers.deals,
		pathParams: [{ name: 'dealId', description: 'Id of the deal.' }],
		body: { name: 'DealInput', schema: dealInputSchema },
		example: {
			body: {
				name: 'Saltmarsh Cold Store',
				content: {
					mode: 'periodic',
					periodsPerYear: 1,
					flows: [
						{ period: 0, amount: '-480000' },
						{ period: 1, amount: '62000' },
						{ period: 2, amount: '64000' },
						{ period: 3, amount: '540000' }
					]
				}
			}
		},
		success: {
			status: 200,
			description: 'The deal at its new version.',
			name: 'Deal',
			schema: dealSchema
		},
		errors: [400, 404, 413, 415, 422]
	},
	audit: {
		operationId: 'listAuditEvents',
		method: 'GET',
		path: '/audit',
		tag: 'Audit trail',
		summary: 'Read the audit trail',
		description:
			'The workspace’s hash-chained audit trail, newest first, 50 a page: every solve, change, sign-in and API call with who and when.',
		roles: writers.audit,
		query: auditParamsSchema,
		example: { query: 'what=loan.&page=1' },
		success: {
			status: 200,
			description: 'One page of events.',
			name: 'AuditPage',
			schema: auditPageSchema
		},
		errors: [400]
	}
} satisfies Record<string, Endpoint>;

export const endpointList: Endpoint[] = Object.values(endpoints);
