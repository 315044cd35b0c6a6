// The OpenAPI 3.1 document of REST API v1, generated from the endpoint catalogue and the zod
// schemas the handlers validate with (zod 4's JSON Schema output, draft 2020-12, which is the
// schema dialect of OpenAPI 3.1). Built once per process.
import { z } from 'zod';
import { apiErrorSchema } from '$lib/schemas/api';
import { appVersion } from '../version';
import { endpointList, type Endpoint } from './endpoints';
import { MAX_BODY_BYTES } from './input';

type JsonSchema = Record<string, unknown>;

const KEY_SCOPES = ['officer', 'analyst', 'reviewer'] as const;

function jsonSchema(schema: z.ZodType, io: 'input' | 'output'): JsonSchema {
	const { $schema: _dialect, ...rest } = z.toJSONSchema(schema, { io, unrepresentable: 'any' });
	return rest as JsonSchema;
}

const errorResponses: Record<number, { name: string; description: string }> = {
	400: { name: 'BadRequest', description: 'Malformed JSON or invalid query parameters.' },
	401: { name: 'Unauthenticated', description: 'No key or session, or an unknown or revoked key.' },
	403: {
		name: 'Forbidden',
		description: 'The key’s scope (or the member’s role) lacks this right.'
	},
	404: { name: 'NotFound', description: 'No such record in this workspace.' },
	409: { name: 'Conflict', description: 'Another loan of the workspace uses that reference.' },
	413: { name: 'PayloadTooLarge', description: `The body is over ${MAX_BODY_BYTES / 1048576} MB.` },
	415: { name: 'UnsupportedMediaType', description: 'The body is not sent as application/json.' },
	422: {
		name: 'ValidationFailed',
		description: 'The JSON does not match the schema (unknown fields included); see error.fields.'
	},
	429: {
		name: 'RateLimited',
		description: 'The key made too many requests this minute; wait Retry-After seconds.'
	},
	500: { name: 'InternalError', description: 'Our fault; quote error.requestId.' }
};

const ALWAYS = [401, 403, 429, 500];

/** Which key scopes may call the operation (admins signed in may call every one). */
export const scopesOf = (endpoint: Endpoint) =>
	KEY_SCOPES.filter((scope) => endpoint.roles.length === 0 || endpoint.roles.includes(scope));

function parameters(endpoint: Endpoint) {
	const list: JsonSchema[] = (endpoint.pathParams ?? []).map((param) => ({
		name: param.name,
		in: 'path',
		required: true,
		description: param.description,
		schema: { type: 'string', format: 'uuid' }
	}));
	if (endpoint.query) {
		const query = jsonSchema(endpoint.query, 'input') as {
			properties?: Record<string, JsonSchema>;
			required?: string[];
		};
		const examples = new URLSearchParams(endpoint.example.query ?? '');
		for (const [name, schema] of Object.entries(query.properties ?? {})) {
			const { description, ...rest } = schema;
			list.push({
				name,
				in: 'query',
				required: query.required?.includes(name) ?? false,
				...(description ? { description } : {}),
				schema: rest,
				...(examples.has(name) ? { example: examples.get(name) } : {})
			});
		}
	}
	return list;
}

function operation(endpoint: Endpoint) {
	const scopes = scopesOf(endpoint);
	const statuses = [...new Set([...endpoint.errors, ...ALWAYS])].sort((a, b) => a - b);
	return {
		operationId: endpoint.operationId,
		tags: [endpoint.tag],
		summary: endpoint.summary,
		description: endpoint.description,
		'x-pincer-scopes': scopes,
		security: [{ apiKey: [] }, { session: [] }],
		parameters: parameters(endpoint),
		...(endpoint.body
			? {
					requestBody: {
						required: true,
						content: {
							'application/json': {
								schema: { $ref: `#/components/schemas/${endpoint.body.name}` },
								...(endpoint.example.body ? { example: endpoint.example.body } : {})
							}
						}
					}
				}
			: {}),
		responses: {
			[endpoint.success.status]: {
				description: endpoint.success.description,
				content: {
					'application/json': {
						schema: { $ref: `#/components/schemas/${endpoint.success.name}` }
					}
				}
			},
			...Object.fromEntries(
				statuses.map((status) => [
					status,
					{ $ref: `#/components/responses/${errorResponses[status].name}` }
				])
			)
		}
	};
}

function buildDocument() {
	const schemas: Record<string, JsonSchema> = { Error: jsonSchema(apiErrorSchema, 'output') };
	const paths: Record<string, Record<string, unknown>> = {};
	for (const endpoint of endpointList) {
		if (endpoint.body) schemas[endpoint.body.name] = jsonSchema(endpoint.body.schema, 'input');
		schemas[endpoint.success.name] = jsonSchema(endpoint.success.schema, 'output');
		(paths[endpoint.path] ??= {})[endpoint.method.toLowerCase()] = operation(endpoint);
	}
	const responses = Object.fromEntries(
		Object.entries(errorResponses).map(([status, { name, description }]) => [
			name,
			{
				description,
				...(status === '429'
					? {
							headers: {
								'Retry-After': {
									description: 'Seconds until the key’s next minute window opens.',
									schema: { type: 'integer' }
								}
							}
						}
					: {}),
				content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } }
			}
		])
	);
	return {
		openapi: '3.1.0',
		info: {
			title: 'Pincer REST API',
			version: `1 (Pincer ${appVersion})`,
			description:
				'Rates solved in exact decimals with a certificate interval, loan files, deals and the audit trail of one workspace. Money and rates are decimal strings. Results follow the published methods as implemented here; your compliance officer and the regulation text govern; this is not legal advice.'
		},
		servers: [{ url: '/api/v1' }],
		tags: [
			{ name: 'Rates', description: 'The rate engine and stored solves.' },
			{ name: 'Loans', description: 'Loan files, their versions and disclosures.' },
			{ name: 'Deals', description: 'Deals and scenarios: dated or periodic cash flows.' },
			{ name: 'Audit trail', description: 'Who did what and when (admin and reviewer).' }
		],
		paths,
		components: {
			schemas,
			responses,
			securitySchemes: {
				apiKey: {
					type: 'http',
					scheme: 'bearer',
					description:
						'An API key made by a workspace admin under Settings → API keys, sent as Authorization: Bearer pincer_…; it acts with the role of its scope.'
				},
				session: {
					type: 'apiKey',
					in: 'cookie',
					name: 'authjs.session-token',
					description:
						'The app’s own session cookie, for calls made by Pincer’s pages (prefixed __Secure- over HTTPS).'
				}
			}
		}
	};
}

let built: ReturnType<typeof buildDocument> | null = null;

/** The OpenAPI document (built on first use). */
export function openApiDocument() {
	built ??= buildDocument();
	return built;
}
