// Helpers for the REST API tests: keys made straight in the e2e database, and a small client.
import { createHash, randomBytes } from 'node:crypto';
import type postgres from 'postgres';
import { inject } from 'vitest';

export type Scope = 'officer' | 'analyst' | 'reviewer';
export const SCOPES: Scope[] = ['officer', 'analyst', 'reviewer'];

/** A live key of the workspace, inserted as the settings page would store it (digest only). */
export async function makeKey(
	sql: postgres.Sql,
	workspaceId: string,
	scope: Scope,
	createdBy: string
): Promise<{ id: string; key: string }> {
	const key = `pincer_${randomBytes(32).toString('base64url')}`;
	const [row] = await sql<{ id: string }[]>`
		insert into api_keys (workspace_id, name, scope, prefix, key_hash, created_by)
		values (${workspaceId}, ${`e2e ${scope}`}, ${scope}, ${key.slice(0, 13)},
			${createHash('sha256').update(key).digest('hex')}, ${createdBy})
		returning id`;
	return { id: row.id, key };
}

/** A key in the right format that no workspace has. */
export const unknownKey = () => `pincer_${randomBytes(32).toString('base64url')}`;

export type Answer = { status: number; body: Record<string, unknown>; headers: Headers };

/** One API call; `body` objects are sent as JSON unless a content type is given with a string body. */
export async function call(
	method: string,
	path: string,
	options: {
		key?: string | null;
		body?: unknown;
		contentType?: string;
		headers?: Record<string, string>;
		base?: string;
	} = {}
): Promise<Answer> {
	const headers: Record<string, string> = { ...options.headers };
	if (options.key) headers.authorization = `Bearer ${options.key}`;
	let body: BodyInit | undefined;
	if (options.body !== undefined) {
		body =
			typeof options.body === 'string' || options.body instanceof Uint8Array
				? (options.body as BodyInit)
				: JSON.stringify(options.body);
		headers['content-type'] = options.contentType ?? 'application/json';
	}
	const response = await fetch(`${options.base ?? inject('baseURL')}/api/v1${path}`, {
		method,
		headers,
		body
	});
	const text = await response.text();
	let parsed: Record<string, unknown>;
	try {
		parsed = JSON.parse(text);
	} catch {
		parsed = { text };
	}
	return { status: response.status, body: parsed, headers: response.headers };
}

/** The error code of an API error answer. */
export const codeOf = (answer: Answer) =>
	(answer.body.error as { code?: string } | undefined)?.code;

/** How many loans, loan versions and solves a workspace has: "nothing changed" compares these. */
export async function footprint(sql: postgres.Sql, workspaceId: string) {
	const [row] = await sql`
		select
			(select count(*)::int from loans where workspace_id = ${workspaceId}) as loans,
			(select count(*)::int from loan_versions v join loans l on l.id = v.loan_id
				where l.workspace_id = ${workspaceId}) as versions,
			(select coalesce(sum(current_version), 0)::int from loans
				where workspace_id = ${workspaceId}) as current_versions,
			(select count(*)::int from solves where workspace_id = ${workspaceId}) as solves`;
	return row;
}
