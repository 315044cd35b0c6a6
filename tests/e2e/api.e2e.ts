// REST API v1 against the built server: the OpenAPI document against what answers, keys and
// scopes, bad input, the rate limit, the session cookie, and the settings and reference pages.
import { randomUUID } from 'node:crypto';
import type { Browser } from 'playwright-core';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { z } from 'zod';
import {
	auditPageSchema,
	dealListSchema,
	dealSchema,
	loanListSchema,
	loanSchema,
	solveCreatedSchema,
	storedSolveSchema
} from '$lib/schemas/api';
import { launchBrowser } from '../support/browser';
import { requireEnv } from '../support/db';
import { startApp } from '../support/server';
import { call, codeOf, footprint, makeKey, SCOPES, unknownKey, type Scope } from './pages/api';
import { ApiKeysPage } from './pages/api-keys';
import { demo, signedIn } from './pages/session';

type Operation = {
	operationId: string;
	'x-pincer-scopes': Scope[];
	parameters: { name: string; in: string; example?: string }[];
	requestBody?: { content: { 'application/json': { example?: Record<string, unknown> } } };
	responses: Record<string, { content?: { 'application/json': { schema: { $ref: string } } } }>;
};
type Document = { openapi: string; paths: Record<string, Record<string, Operation>> };

const responseSchemas: Record<string, z.ZodType> = {
	DealList: dealListSchema,
	Deal: dealSchema,
	SolveCreated: solveCreatedSchema,
	StoredSolve: storedSolveSchema,
	LoanList: loanListSchema,
	Loan: loanSchema,
	AuditPage: auditPageSchema
};

/** 12 CFR 1026 Appendix J (b)(9): $1,000 repaid in 36 monthly payments of $33.61; APR 12.83%. */
function appendixJRequest() {
	const payments = Array.from({ length: 36 }, (_, k) => {
		const month = 1 + k; // February 2026 onwards
		const date = `${2026 + Math.floor(month / 12)}-${String((month % 12) + 1).padStart(2, '0')}-10`;
		return { date, amount: '33.61' };
	});
	return { kind: 'apr-us', advances: [{ date: '2026-01-10', amount: '1000.00' }], payments };
}

describe('REST API v1', () => {
	let sql: postgres.Sql;
	let browser: Browser;
	let workspaceId: string;
	let adminId: string;
	const keys = {} as Record<Scope, { id: string; key: string }>;
	let document: Document;
	let operations: { method: string; path: string; op: Operation }[];
	const tag = () => randomUUID().slice(0, 8).toUpperCase();

	beforeAll(async () => {
		sql = postgres(requireEnv('PINCER_E2E_DATABASE_URL'), { max: 2, onnotice: () => {} });
		browser = await launchBrowser();
		const [admin] = await sql<{ workspace_id: string; user_id: string }[]>`
			select m.workspace_id, m.user_id from memberships m
			join workspaces w on w.id = m.workspace_id join users u on u.id = m.user_id
			where w.slug = 'bramblecove' and u.email = ${demo('admin')}`;
		workspaceId = admin.workspace_id;
		adminId = admin.user_id;
		for (const scope of SCOPES) keys[scope] = await makeKey(sql, workspaceId, scope, adminId);
		const answer = await fetch(`${inject('baseURL')}/api/v1/openapi.json`);
		document = (await answer.json()) as Document;
		operations = Object.entries(document.paths).flatMap(([path, methods]) =>
			Object.entries(methods).map(([method, op]) => ({ method: method.toUpperCase(), path, op }))
		);
	});
	afterAll(async () => {
		await browser?.close();
		await sql?.end();
	});

	/** A loan made through the API, for paths with {loanId}. */
	async function newLoan() {
		const example = document.paths['/loans'].post.requestBody!.content['application/json'].example!;
		const terms = { ...(example.terms as object), reference: `API-${tag()}` };
		const made = await call('POST', '/loans', {
			key: keys.officer.key,
			body: { ...example, terms }
		});
		expect(made.status).toBe(201);
		return made.body as { id: string; reference: string };
	}

	/** A deal made through the API, for paths with {dealId}. */
	async function newDeal() {
		const example = document.paths['/deals'].post.requestBody!.content['application/json'].example!;
		const made = await call('POST', '/deals', { key: keys.analyst.key, body: example });
		expect(made.status).toBe(201);
		return made.body as { id: string };
	}

	/** The documented example request of an operation, made concrete. */
	async function exampleOf(method: string, path: string, op: Operation) {
		const loan = path.includes('{loanId}') ? await newLoan() : null;
		const deal = path.includes('{dealId}') ? await newDeal() : null;
		const solved = path.includes('{solveId}')
			? await call('POST', '/solve', { key: keys.analyst.key, body: appendixJRequest() })
			: null;
		const query = new URLSearchParams(
			op.parameters
				.filter((p) => p.in === 'query' && p.example !== undefined)
				.map((p) => [p.name, p.example!])
		).toString();
		const url =
			path
				.replace('{loanId}', loan?.id ?? '')
				.replace('{dealId}', deal?.id ?? '')
				.replace('{solveId}', String(solved?.body.id)) + (query ? `?${query}` : '');
		let body = op.requestBody?.content['application/json'].example;
		if (body?.terms) body = { ...body, terms: { ...body.terms, reference: `API-${tag()}` } };
		if (body?.header && loan)
			body = { ...body, header: { ...body.header, reference: loan.reference } };
		return { url, body };
	}

	it('serves an OpenAPI 3.1 document whose every operation exists and answers as documented', async () => {
		expect(document.openapi).toBe('3.1.0');
		expect(operations.length).toBeGreaterThanOrEqual(11);
		for (const { method, path, op } of operations) {
			const { url, body } = await exampleOf(method, path, op);
			const answer = await call(method, url, { key: keys[op['x-pincer-scopes'][0]].key, body });
			const [status, documented] = Object.entries(op.responses).find(([s]) => Number(s) < 400)!;
			expect(answer.status, `${method} ${path}: ${JSON.stringify(answer.body)}`).toBe(
				Number(status)
			);
			const name = documented.content!['application/json'].schema.$ref.split('/').at(-1)!;
			const parsed = responseSchemas[name].safeParse(answer.body);
			expect(parsed.error?.issues ?? [], `${method} ${path} matches ${name}`).toEqual([]);
		}
	});

	it('answers every operation with 401 for a missing, unknown or malformed key and 403 for a scope it lacks', async () => {
		let refusedScopes = 0;
		for (const { method, path, op } of operations) {
			const { url, body } = await exampleOf(method, path, op);
			const before = await footprint(sql, workspaceId);
			for (const key of [null, unknownKey(), 'pincer_short']) {
				const answer = await call(method, url, { key, body });
				expect(answer.status, `${method} ${path} with key ${key}`).toBe(401);
				expect(codeOf(answer)).toBe('unauthenticated');
			}
			for (const scope of SCOPES.filter((s) => !op['x-pincer-scopes'].includes(s))) {
				refusedScopes++;
				const answer = await call(method, url, { key: keys[scope].key, body });
				expect(answer.status, `${method} ${path} with a ${scope} key`).toBe(403);
				expect(codeOf(answer)).toBe('forbidden');
			}
			expect(await footprint(sql, workspaceId), `${method} ${path} changed nothing`).toEqual(
				before
			);
		}
		expect(refusedScopes).toBeGreaterThanOrEqual(5);
		// Refusals of a known key are in the audit trail; strangers' calls are not.
		const [recorded] = await sql`
			select count(*)::int as n from audit_events
			where workspace_id = ${workspaceId} and action = 'api.call'
				and subject = ${`api_key:${keys.reviewer.id}`} and payload->>'status' = '403'`;
		expect(recorded.n).toBeGreaterThan(0);
	});

	it('answers another workspace’s loan with 404, not 403', async () => {
		const loan = await newLoan();
		const [other] = await sql<{ id: string }[]>`
			insert into workspaces (name, slug) values ('Elsewhere Test Lending', ${`elsewhere-${tag()}`})
			returning id`;
		const stranger = await makeKey(sql, other.id, 'officer', adminId);
		const answer = await call('GET', `/loans/${loan.id}`, { key: stranger.key });
		expect(answer.status).toBe(404);
		expect(codeOf(answer)).toBe('not_found');
		const listed = await call('GET', '/loans', { key: stranger.key });
		expect((listed.body as { total: number }).total).toBe(0);
	});

	it('refuses malformed JSON, a wrong content type, unknown fields, oversize bodies and a revoked key, changing nothing', async () => {
		const loan = await newLoan();
		const valid = document.paths['/loans'].post.requestBody!.content['application/json'].example!;
		const writes = [
			{ method: 'POST', path: '/solve', body: appendixJRequest() },
			{ method: 'POST', path: '/loans', body: valid },
			{ method: 'PUT', path: `/loans/${loan.id}`, body: valid }
		];
		const revoked = await makeKey(sql, workspaceId, 'officer', adminId);
		await sql`update api_keys set revoked_at = now() where id = ${revoked.id}`;
		const big = new TextEncoder().encode(`{"kind":"irr","flows":[${'"1",'.repeat(1_500_000)}"1"]}`);
		expect(big.byteLength).toBeGreaterThan(5 * 1024 * 1024);
		const key = keys.officer.key;
		for (const write of writes) {
			const before = await footprint(sql, workspaceId);
			const cases: [string, () => ReturnType<typeof call>, number, string][] = [
				[
					'malformed JSON',
					() => call(write.method, write.path, { key, body: '{"kind": "irr", "flows": [' }),
					400,
					'malformed_json'
				],
				[
					'an XML body',
					() =>
						call(write.method, write.path, {
							key,
							body: '<solve/>',
							contentType: 'application/xml'
						}),
					415,
					'unsupported_media_type'
				],
				[
					'text/plain from our own origin',
					() =>
						call(write.method, write.path, {
							key,
							body: JSON.stringify(write.body),
							contentType: 'text/plain',
							headers: { origin: inject('baseURL') }
						}),
					415,
					'unsupported_media_type'
				],
				[
					'no body at all',
					() => call(write.method, write.path, { key }),
					415,
					'unsupported_media_type'
				],
				[
					'an unknown field',
					() => call(write.method, write.path, { key, body: { ...write.body, colour: 'teal' } }),
					422,
					'validation_failed'
				],
				[
					'a body over 5 MB (declared length)',
					() => call(write.method, write.path, { key, body: big }),
					413,
					'payload_too_large'
				],
				[
					'a body over 5 MB (chunked, no length)',
					async () => {
						const response = await fetch(`${inject('baseURL')}/api/v1${write.path}`, {
							method: write.method,
							headers: { authorization: `Bearer ${key}`, 'content-type': 'application/json' },
							body: new Blob([big]).stream(),
							duplex: 'half'
						} as RequestInit);
						return {
							status: response.status,
							body: await response.json(),
							headers: response.headers
						};
					},
					413,
					'payload_too_large'
				],
				[
					'a revoked key',
					() => call(write.method, write.path, { key: revoked.key, body: write.body }),
					401,
					'unauthenticated'
				]
			];
			for (const [what, send, status, code] of cases) {
				const answer = await send();
				expect(answer.status, `${write.method} ${write.path}: ${what}`).toBe(status);
				expect(codeOf(answer), `${write.method} ${write.path}: ${what}`).toBe(code);
			}
			expect(await footprint(sql, workspaceId), `${write.method} ${write.path}`).toEqual(before);
		}
		const unknown = await call('POST', '/solve', {
			key,
			body: { ...appendixJRequest(), colour: 'teal', stop: { rateTolerance: '1e-12', speed: 9 } }
		});
		expect((unknown.body.error as { fields: Record<string, string[]> }).fields).toEqual({
			colour: [expect.stringContaining('Unknown field')],
			'stop.speed': [expect.stringContaining('Unknown field')]
		});
		const nested = await call('POST', '/loans', {
			key,
			body: { ...valid, terms: { ...(valid.terms as object), colour: 'teal' } }
		});
		expect(Object.keys((nested.body.error as { fields: object }).fields)).toEqual(['terms.colour']);
	});

	it('answers 429 with Retry-After once a key passes its per-minute limit', async () => {
		const limited = await startApp({
			DATABASE_URL: requireEnv('PINCER_E2E_DATABASE_URL'),
			PINCER_API_RATE_LIMIT: '3'
		});
		try {
			const busy = await makeKey(sql, workspaceId, 'reviewer', adminId);
			const quiet = await makeKey(sql, workspaceId, 'reviewer', adminId);
			// Keep the burst inside one minute window.
			const second = new Date().getUTCSeconds();
			if (second >= 50) await new Promise((r) => setTimeout(r, (61 - second) * 1000));
			const statuses: number[] = [];
			let last: Awaited<ReturnType<typeof call>> | null = null;
			for (let i = 0; i < 5; i++) {
				last = await call('GET', '/loans', { key: busy.key, base: limited.baseURL });
				statuses.push(last.status);
			}
			expect(statuses).toEqual([200, 200, 200, 429, 429]);
			expect(codeOf(last!)).toBe('rate_limited');
			const retryAfter = Number(last!.headers.get('retry-after'));
			expect(Number.isInteger(retryAfter)).toBe(true);
			expect(retryAfter).toBeGreaterThanOrEqual(1);
			expect(retryAfter).toBeLessThanOrEqual(60);
			const other = await call('GET', '/loans', { key: quiet.key, base: limited.baseURL });
			expect(other.status).toBe(200);
		} finally {
			await limited.stop();
		}
	});

	it('solves the Appendix J (b)(9) loan to a disclosed 12.83% and stores the solve', async () => {
		// Source: 12 CFR 1026, Appendix J, paragraph (b)(9): $1,000 advanced, 36 monthly payments
		// of $33.61, annual percentage rate 12.83%.
		const request = appendixJRequest();
		const answer = await call('POST', '/solve', { key: keys.officer.key, body: request });
		expect(answer.status).toBe(200);
		expect(answer.body.status).toBe('solved');
		expect(answer.body.disclosed).toBe('12.83');
		const stored = await call('GET', `/solves/${answer.body.id}`, { key: keys.reviewer.key });
		expect(stored.status).toBe(200);
		expect(stored.body.request).toEqual(request);
		expect(stored.body.subject).toEqual({ type: 'api', id: keys.officer.id, version: null });
		expect((stored.body.result as { disclosed: string }).disclosed).toBe('12.83');
		const [event] = await sql`
			select actor_id, payload from audit_events
			where workspace_id = ${workspaceId} and action = 'solve.run'
				and subject = ${`solve:${answer.body.id}`}`;
		expect(event.actor_id).toBe(adminId);
		expect(event.payload.for).toBe(`api:${keys.officer.id}`);

		// The body is stored as it came: laid out over lines, with an escaped key, it still
		// reads back as the same request.
		const laidOut = JSON.stringify(request, null, 2).replace('"kind"', '"\\u006bind"');
		const again = await call('POST', '/solve', { key: keys.officer.key, body: laidOut });
		expect(again.status).toBe(200);
		const [row] =
			await sql`select request::text as text from solves where id = ${String(again.body.id)}`;
		expect(row.text).toBe(laidOut);
		const readBack = await call('GET', `/solves/${again.body.id}`, { key: keys.reviewer.key });
		expect(readBack.body.request).toEqual(request);
	});

	it('lets an admin make a key shown once, use it and revoke it; others cannot open the page', async () => {
		const { context, page } = await signedIn(browser, demo('admin'));
		const keysPage = new ApiKeysPage(page);
		await keysPage.open();
		const name = `Model ${tag()}`;
		const key = await keysPage.create(name, 'analyst');
		expect(key).toMatch(/^pincer_[A-Za-z0-9_-]{43}$/);
		expect((await call('GET', '/loans', { key })).status).toBe(200);
		await keysPage.open();
		await expect(page.getByTestId('new-key').count()).resolves.toBe(0);
		await expect(keysPage.row(name).textContent()).resolves.toContain(key.slice(0, 13));
		await expect(keysPage.row(name).textContent()).resolves.not.toContain(key.slice(13));
		await expect(keysPage.row(name).textContent()).resolves.not.toContain('never');
		await keysPage.revoke(name);
		const refused = await call('GET', '/loans', { key });
		expect(refused.status).toBe(401);
		const [created] = await sql`
			select count(*)::int as n from audit_events
			where workspace_id = ${workspaceId} and action in ('api_key.create', 'api_key.revoke')
				and payload->>'name' = ${name}`;
		expect(created.n).toBe(2);
		await context.close();

		const officer = await signedIn(browser, demo('officer'));
		const answer = await new ApiKeysPage(officer.page).open();
		expect(answer?.status()).toBe(403);
		await officer.page.goto(`${inject('baseURL')}/app`);
		const nav = await officer.page.getByRole('navigation', { name: 'Main' }).textContent();
		expect(nav).toContain('API reference');
		expect(nav).not.toContain('API keys');
		await officer.context.close();
	});

	it('accepts the session cookie for the app’s own calls, with the member’s role', async () => {
		const officer = await signedIn(browser, demo('officer'));
		const base = inject('baseURL');
		const listed = await officer.context.request.get(`${base}/api/v1/loans`);
		expect(listed.status()).toBe(200);
		const solved = await officer.context.request.post(`${base}/api/v1/solve`, {
			data: appendixJRequest(),
			headers: { origin: base }
		});
		expect(solved.status()).toBe(200);
		expect((await solved.json()).disclosed).toBe('12.83');
		await officer.context.close();
		const reviewer = await signedIn(browser, demo('reviewer'));
		const refused = await reviewer.context.request.post(`${base}/api/v1/solve`, {
			data: appendixJRequest(),
			headers: { origin: base }
		});
		expect(refused.status()).toBe(403);
		expect((await refused.json()).error.code).toBe('forbidden');
		await reviewer.context.close();
	});

	it('renders the API reference from the document: every operation with its scopes and a curl example', async () => {
		const { context, page } = await signedIn(browser, demo('reviewer'));
		await page.goto(`${inject('baseURL')}/app/api`);
		await expect(page.getByTestId('endpoint').count()).resolves.toBe(operations.length);
		const curls = await page.getByTestId('curl').allTextContents();
		for (const { method, path } of operations) {
			const shown = path.replace(
				/\{(\w+)\}/g,
				(_, n: string) => `$${n.replace(/Id$/, '').toUpperCase()}_ID`
			);
			expect(
				curls.some(
					(c) => c.includes(`/api/v1${shown}`) && (method === 'GET' || c.includes(`-X ${method}`))
				),
				`${method} ${path}`
			).toBe(true);
		}
		await context.close();
	});
});
