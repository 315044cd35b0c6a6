// Walks every server route file and fails when a load, form action or request handler does not
// call one of our guards. Public entry points are listed by file, with the reason.
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';
import { repoRoot } from '../support/server';

const GUARDS = /\b(requireUser|requireRole|requireApiCaller)\s*\(/;

// Files whose entry points are public on purpose.
const PUBLIC: Record<string, string> = {
	'src/routes/healthz/+server.ts': 'health check for operators; no workspace data',
	'src/routes/(auth)/signin/+page.server.ts': 'signing in',
	'src/routes/(auth)/signup/+page.server.ts': 'signing up',
	'src/routes/(auth)/forgot/+page.server.ts': 'asking for a reset link',
	'src/routes/(auth)/reset/[token]/+page.server.ts': 'the reset token is the authority',
	'src/routes/(auth)/invite/[token]/+page.server.ts':
		'the invitation token is the authority (accept uses requireUser)',
	'src/routes/(auth)/signout/+page.server.ts': 'signing out needs no role',
	'src/routes/api/v1/webhooks/stripe/+server.ts':
		'Stripe calls it; the signature over the raw body is the authority',
	'src/routes/api/v1/openapi.json/+server.ts': 'the API description; no workspace data',
	'src/routes/api/v1/[...unknown]/+server.ts': 'JSON 404 for paths the API lacks; reads nothing'
};

const HANDLERS = new Set([
	'GET',
	'POST',
	'PUT',
	'PATCH',
	'DELETE',
	'OPTIONS',
	'HEAD',
	'fallback',
	'load'
]);

function routeFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
		const path = join(dir, entry.name);
		if (entry.isDirectory()) return routeFiles(path);
		return /^\+(page|layout)\.server\.ts$|^\+server\.ts$/.test(entry.name) ? [path] : [];
	});
}

/** Each exported entry point of a route file with the source text of its body. */
function entryPoints(file: string): { name: string; body: string }[] {
	const source = ts.createSourceFile(
		file,
		readFileSync(file, 'utf8'),
		ts.ScriptTarget.Latest,
		true
	);
	const found: { name: string; body: string }[] = [];
	const exported = (node: ts.Node) =>
		ts.canHaveModifiers(node) &&
		(ts.getModifiers(node) ?? []).some((m) => m.kind === ts.SyntaxKind.ExportKeyword);
	source.forEachChild((node) => {
		if (
			ts.isFunctionDeclaration(node) &&
			exported(node) &&
			node.name &&
			HANDLERS.has(node.name.text)
		) {
			found.push({ name: node.name.text, body: node.body?.getText() ?? '' });
		}
		if (ts.isVariableStatement(node) && exported(node)) {
			for (const decl of node.declarationList.declarations) {
				const name = decl.name.getText();
				const init = decl.initializer;
				if (!init) continue;
				if (name === 'actions') {
					const object = ts.isObjectLiteralExpression(init)
						? init
						: ts.isSatisfiesExpression(init) && ts.isObjectLiteralExpression(init.expression)
							? init.expression
							: null;
					if (!object) {
						found.push({ name: 'actions', body: '' });
						continue;
					}
					for (const prop of object.properties) {
						found.push({ name: `actions.${prop.name?.getText() ?? '?'}`, body: prop.getText() });
					}
				} else if (HANDLERS.has(name)) {
					found.push({ name, body: init.getText() });
				}
			}
		}
	});
	return found;
}

describe('guard coverage', () => {
	const files = routeFiles(join(repoRoot, 'src/routes')).map((f) => relative(repoRoot, f));

	it('finds the route files', () => {
		expect(files.length).toBeGreaterThan(5);
	});

	it.each(files.filter((f) => !(f in PUBLIC)))('%s guards every entry point', (file) => {
		const points = entryPoints(join(repoRoot, file));
		expect(points.length, 'a server route file with no entry point').toBeGreaterThan(0);
		const unguarded = points.filter((p) => !GUARDS.test(p.body)).map((p) => p.name);
		expect(unguarded, `entry points without requireUser/requireRole in ${file}`).toEqual([]);
	});

	it('lists only public files that exist', () => {
		for (const file of Object.keys(PUBLIC)) expect(files).toContain(file);
	});

	it('detects a missing guard (the checker itself can fail)', () => {
		const fake = join(repoRoot, 'tests/integration/fixtures/unguarded.server.ts.txt');
		const points = entryPoints(fake);
		expect(points.map((p) => p.name)).toEqual(['load', 'actions.save', 'actions.remove']);
		expect(points.filter((p) => !GUARDS.test(p.body)).map((p) => p.name)).toEqual([
			'actions.remove'
		]);
	});
});
