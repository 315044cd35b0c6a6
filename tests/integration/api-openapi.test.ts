// The OpenAPI document against the code: every documented operation has a handler, every handler
// is documented, every reference resolves and every example passes the schema it illustrates.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { endpointList } from '$lib/server/api/endpoints';
import { openApiDocument } from '$lib/server/api/openapi';
import { repoRoot } from '../support/server';

const apiRoot = join(repoRoot, 'src/routes/api/v1');
const routeFileOf = (path: string) =>
	join(apiRoot, path.replace(/\{(\w+)\}/g, '[$1]'), '+server.ts');

function serverFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
		const path = join(dir, entry.name);
		return entry.isDirectory() ? serverFiles(path) : entry.name === '+server.ts' ? [path] : [];
	});
}

function refs(value: unknown): string[] {
	if (Array.isArray(value)) return value.flatMap(refs);
	if (value && typeof value === 'object') {
		return Object.entries(value).flatMap(([key, item]) =>
			key === '$ref' && typeof item === 'string' ? [item] : refs(item)
		);
	}
	return [];
}

describe('OpenAPI document', () => {
	const document = openApiDocument();

	it('is OpenAPI 3.1 with JSON Schema 2020-12 schemas and resolvable references', () => {
		expect(document.openapi).toBe('3.1.0');
		const all = refs(document);
		expect(all.length).toBeGreaterThan(10);
		for (const ref of all) {
			const [, section, name] = /^#\/components\/(schemas|responses)\/(\w+)$/.exec(ref) ?? [];
			expect(section, ref).toBeDefined();
			expect(document.components[section as 'schemas' | 'responses'], ref).toHaveProperty(name);
		}
		expect(JSON.stringify(document)).not.toContain('"$schema"');
	});

	it('documents each operation of the catalogue, with a handler exporting its method', () => {
		for (const endpoint of endpointList) {
			const operation = (document.paths as Record<string, Record<string, unknown>>)[
				endpoint.path
			]?.[endpoint.method.toLowerCase()];
			expect(operation, `${endpoint.method} ${endpoint.path}`).toBeDefined();
			const file = routeFileOf(endpoint.path);
			expect(existsSync(file), file).toBe(true);
			expect(readFileSync(file, 'utf8')).toMatch(new RegExp(`export const ${endpoint.method}\\b`));
		}
	});

	it('leaves no API handler undocumented', () => {
		const documented = new Set(endpointList.map((e) => routeFileOf(e.path)));
		const undocumented = serverFiles(apiRoot)
			.filter((file) => !documented.has(file))
			.map((file) => relative(apiRoot, file))
			.filter((file) => !['openapi.json/+server.ts', '[...unknown]/+server.ts'].includes(file))
			// Webhooks are for payment providers, not API clients.
			.filter((file) => !file.startsWith('webhooks/'));
		expect(undocumented).toEqual([]);
	});

	it('gives examples that pass the schemas they illustrate', () => {
		for (const endpoint of endpointList) {
			if (endpoint.body) {
				const parsed = endpoint.body.schema.safeParse(endpoint.example.body);
				expect(parsed.error?.issues ?? [], endpoint.operationId).toEqual([]);
			}
			if (endpoint.query) {
				const query = Object.fromEntries(new URLSearchParams(endpoint.example.query ?? ''));
				expect(endpoint.query.safeParse(query).success, endpoint.operationId).toBe(true);
			}
		}
	});

	it('states the key scopes of each operation', () => {
		const scopes = Object.fromEntries(
			endpointList.map((e) => [
				`${e.method} ${e.path}`,
				(document.paths as Record<string, Record<string, { 'x-pincer-scopes': string[] }>>)[e.path][
					e.method.toLowerCase()
				]['x-pincer-scopes']
			])
		);
		expect(scopes['POST /solve']).toEqual(['officer', 'analyst']);
		expect(scopes['POST /loans']).toEqual(['officer']);
		expect(scopes['GET /audit']).toEqual(['reviewer']);
		expect(scopes['GET /loans']).toEqual(['officer', 'analyst', 'reviewer']);
		expect(scopes['PUT /deals/{dealId}']).toEqual(['analyst']);
	});
});
