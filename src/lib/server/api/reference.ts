// The API reference page's reading of the OpenAPI document: one entry per operation, schemas
// resolved from components, and the operation's example written as a curl command.
import { openApiDocument } from './openapi';

type Schema = Record<string, unknown>;
type Parameter = {
	name: string;
	in: 'path' | 'query';
	required: boolean;
	description?: string;
	schema: Schema;
	example?: string;
};
type Media = { 'application/json': { schema: { $ref: string }; example?: unknown } };
type Operation = {
	operationId: string;
	tags: string[];
	summary: string;
	description: string;
	'x-pincer-scopes': string[];
	parameters: Parameter[];
	requestBody?: { content: Media };
	responses: Record<string, { $ref?: string; description?: string; content?: Media }>;
};

const shellQuote = (text: string) => `'${text.replace(/'/g, `'\\''`)}'`;
/** loanId → $LOAN_ID */
const placeholder = (name: string) => `$${name.replace(/Id$/, '').toUpperCase()}_ID`;
const refName = (ref: string | undefined) => ref?.split('/').at(-1) ?? '';

/** JSON on one line with a space after each comma and colon. */
function inlineJson(value: unknown): string {
	if (value === null || typeof value !== 'object') return JSON.stringify(value);
	if (Array.isArray(value)) return `[${value.map(inlineJson).join(', ')}]`;
	const entries = Object.entries(value as Record<string, unknown>);
	return `{${entries.map(([key, item]) => `${JSON.stringify(key)}: ${inlineJson(item)}`).join(', ')}}`;
}

/** JSON indented by two spaces, with any object or list that fits in 72 columns on one line. */
export function compactJson(value: unknown, indent = ''): string {
	const flat = inlineJson(value);
	if (value === null || typeof value !== 'object' || indent.length + flat.length <= 72) return flat;
	const inner = `${indent}  `;
	if (Array.isArray(value)) {
		return `[\n${value.map((item) => inner + compactJson(item, inner)).join(',\n')}\n${indent}]`;
	}
	const entries = Object.entries(value as Record<string, unknown>).map(
		([key, item]) => `${inner}${JSON.stringify(key)}: ${compactJson(item, inner)}`
	);
	return `{\n${entries.join(',\n')}\n${indent}}`;
}

/** A curl command for the operation with its documented example, key and ids as shell variables. */
export function curlExample(origin: string, method: string, path: string, operation: Operation) {
	const route = path.replace(/\{(\w+)\}/g, (_, name: string) => placeholder(name));
	const query = new URLSearchParams(
		operation.parameters
			.filter((p) => p.in === 'query' && p.example !== undefined)
			.map((p) => [p.name, String(p.example)])
	).toString();
	const lines = [
		`curl${method === 'get' ? '' : ` -X ${method.toUpperCase()}`} "${origin}/api/v1${route}${query ? `?${query}` : ''}"`,
		'  -H "Authorization: Bearer $PINCER_API_KEY"'
	];
	const body = operation.requestBody?.content['application/json'].example;
	if (body !== undefined) {
		lines.push('  -H "Content-Type: application/json"');
		lines.push(`  --data ${shellQuote(compactJson(body))}`);
	}
	return lines.join(' \\\n');
}

export function referenceEntries(origin: string) {
	const document = openApiDocument();
	const schemas = document.components.schemas as Record<string, Schema>;
	const errorTexts = document.components.responses as Record<string, { description: string }>;
	return Object.entries(document.paths).flatMap(([path, methods]) =>
		Object.entries(methods as Record<string, Operation>).map(([method, operation]) => {
			const responses = Object.entries(operation.responses);
			const [status, success] = responses.find(([code]) => Number(code) < 400) ?? [];
			const successName = refName(success?.content?.['application/json'].schema.$ref);
			const bodyName = refName(operation.requestBody?.content['application/json'].schema.$ref);
			return {
				id: operation.operationId,
				method: method.toUpperCase(),
				path,
				tag: operation.tags[0],
				summary: operation.summary,
				description: operation.description,
				scopes: operation['x-pincer-scopes'],
				parameters: operation.parameters,
				request: bodyName ? { name: bodyName, schema: schemas[bodyName] } : null,
				response: {
					status: status ?? '200',
					description: success?.description ?? '',
					name: successName,
					schema: schemas[successName]
				},
				errors: responses
					.filter(([code]) => Number(code) >= 400)
					.map(([code, value]) => ({
						status: code,
						description: errorTexts[refName(value.$ref)]?.description ?? ''
					})),
				curl: curlExample(origin, method, path, operation)
			};
		})
	);
}

export type ReferenceEntry = ReturnType<typeof referenceEntries>[number];
