import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase, dropDatabase, runScript } from '../support/db';

const NAME = 'pincer_migrations_test';

describe('committed migrations', () => {
	let url: string;
	let sql: postgres.Sql;
	beforeAll(async () => {
		url = await createDatabase(NAME);
		sql = postgres(url, { max: 1, onnotice: () => {} });
	});
	afterAll(async () => {
		await sql.end();
		await dropDatabase(NAME);
	});

	it('apply to an empty database, twice without harm', async () => {
		runScript('migrate', url);
		runScript('migrate', url);
		const tables = await sql<{ table_name: string }[]>`
			select table_name from information_schema.tables where table_schema = 'public'`;
		expect(tables.map((t) => t.table_name)).toEqual(
			expect.arrayContaining(['workspaces', 'users', 'memberships', 'audit_events'])
		);
	});

	it('make audit_events append-only: UPDATE, DELETE and TRUNCATE are rejected', async () => {
		const [row] =
			await sql`insert into audit_events (action, payload) values ('test.append', '{}') returning id`;
		await expect(
			sql`update audit_events set action = 'test.rewritten' where id = ${row.id}`
		).rejects.toThrow(/append-only: UPDATE/);
		await expect(sql`delete from audit_events where id = ${row.id}`).rejects.toThrow(
			/append-only: DELETE/
		);
		await expect(sql`truncate audit_events`).rejects.toThrow(/append-only: TRUNCATE/);
		const [still] = await sql`select action from audit_events where id = ${row.id}`;
		expect(still.action).toBe('test.append');
	});

	it('seed the demo workspace once: a second run duplicates nothing and keeps edits', async () => {
		runScript('seed', url);
		await sql`update workspaces set name = 'Renamed by a user' where slug = 'bramblecove'`;
		runScript('seed', url);
		const workspaces = await sql`select name from workspaces where slug = 'bramblecove'`;
		expect(workspaces.map((w) => w.name)).toEqual(['Renamed by a user']);
		const [{ count }] = await sql`select count(*)::int as count from memberships`;
		expect(count).toBe(4);
	});
});
