import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { asc, eq } from 'drizzle-orm';
import { appendAuditEvent, checkChain } from '$lib/server/audit';
import { appendAuditEvents } from '$lib/server/audit/chain';
import { auditEvents } from '$lib/server/db/schema';
import { db } from '$lib/server/db';
import { requireEnv } from '../support/db';
import { makeMember, makeWorkspace } from '../support/fixtures';

describe('audit hash chain', () => {
	let superuser: postgres.Sql;
	beforeAll(() => {
		const url = new URL(requireEnv('PINCER_TEST_SUPERUSER_URL'));
		url.pathname = new URL(requireEnv('PINCER_IT_DATABASE_URL')).pathname;
		superuser = postgres(url.toString(), { max: 1, onnotice: () => {} });
	});
	afterAll(async () => {
		await superuser.end();
	});

	async function workspaceWithEvents(n: number) {
		const workspace = await makeWorkspace();
		const { user } = await makeMember(workspace.id, 'admin');
		const ids: number[] = [];
		for (let i = 0; i < n; i++) {
			const { id } = await db.transaction((tx) =>
				appendAuditEvent(tx, {
					workspaceId: workspace.id,
					actorId: user.id,
					action: 'test.event',
					subject: `thing:${i}`,
					payload: { index: i, amount: '1000.00', nested: { b: 2, a: [1, 'x'] } }
				})
			);
			ids.push(id);
		}
		return { workspace, ids };
	}

	/** What a superuser could do: switch the append-only trigger off and rewrite history. */
	async function tamper(statement: (sql: postgres.TransactionSql) => Promise<unknown>) {
		await superuser.begin(async (sql) => {
			await sql`alter table audit_events disable trigger audit_events_append_only`;
			await statement(sql);
			await sql`alter table audit_events enable trigger audit_events_append_only`;
		});
	}

	it('reports an untouched chain as intact with its event count', async () => {
		const { workspace } = await workspaceWithEvents(6);
		expect(await checkChain(db, workspace.id)).toEqual({ intact: true, events: 6 });
	});

	it('names the exact event whose content a superuser edited', async () => {
		const { workspace, ids } = await workspaceWithEvents(6);
		await tamper(
			(sql) => sql`update audit_events set payload = '{"index": 99}' where id = ${ids[3]}`
		);
		const result = await checkChain(db, workspace.id);
		expect(result.intact).toBe(false);
		if (result.intact) return;
		expect(result.brokenAt.id).toBe(ids[3]);
		expect(result.brokenAt.reason).toMatch(/content/);
		expect(result.events).toBe(4);
	});

	it('names the event after one that a superuser deleted', async () => {
		const { workspace, ids } = await workspaceWithEvents(5);
		await tamper((sql) => sql`delete from audit_events where id = ${ids[1]}`);
		const result = await checkChain(db, workspace.id);
		expect(result.intact).toBe(false);
		if (result.intact) return;
		expect(result.brokenAt.id).toBe(ids[2]);
		expect(result.brokenAt.reason).toMatch(/before it/);
	});

	it('keeps one chain per workspace under concurrent appends', async () => {
		const workspace = await makeWorkspace();
		await Promise.all(
			Array.from({ length: 25 }, (_, i) =>
				db.transaction((tx) =>
					appendAuditEvent(tx, {
						workspaceId: workspace.id,
						actorId: null,
						action: 'test.concurrent',
						payload: { i }
					})
				)
			)
		);
		expect(await checkChain(db, workspace.id)).toEqual({ intact: true, events: 25 });
	});

	it('hashes in the database exactly as the app checks them, for any text and in given order', async () => {
		const workspace = await makeWorkspace();
		const { user } = await makeMember(workspace.id, 'admin');
		const texts = [
			'Crédit à la consommation',
			'Zinsen 1½ %',
			'利率',
			'emoji 🦀',
			'quote " and \\ slash'
		];
		const appended = await db.transaction((tx) =>
			appendAuditEvents(
				tx,
				workspace.id,
				texts.map((text, i) => ({
					workspaceId: workspace.id,
					actorId: i % 2 ? user.id : null,
					action: 'test.text',
					subject: i === 0 ? null : `thing:${text}`,
					payload: { text, nested: { z: [text, i], a: null } }
				}))
			)
		);
		expect(appended.map((e) => e.id)).toEqual([...appended.map((e) => e.id)].sort((a, b) => a - b));
		const rows = await db
			.select({ id: auditEvents.id, prevHash: auditEvents.prevHash, hash: auditEvents.hash })
			.from(auditEvents)
			.where(eq(auditEvents.workspaceId, workspace.id))
			.orderBy(asc(auditEvents.id));
		expect(rows.map((r) => r.hash)).toEqual(appended.map((e) => e.hash));
		expect(rows[0].prevHash).toBe('');
		rows.slice(1).forEach((row, i) => expect(row.prevHash).toBe(rows[i].hash));
		expect(await checkChain(db, workspace.id)).toEqual({ intact: true, events: texts.length });
	});
});
