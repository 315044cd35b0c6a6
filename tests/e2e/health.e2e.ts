import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { makeCluster, type Cluster } from '../support/cluster';
import { runScript } from '../support/db';
import { startApp, type RunningApp } from '../support/server';

describe('GET /healthz', () => {
	it('reports ok with the database reachable and migrations applied', async () => {
		const res = await fetch(`${inject('baseURL')}/healthz`);
		expect(res.status).toBe(200);
		const body = await res.json();
		expect(body.status).toBe('ok');
		expect(body.database.reachable).toBe(true);
		expect(body.migrations.pending).toBe(false);
		expect(body.migrations.applied).toBe(body.migrations.expected);
		expect(body.version).toMatch(/^\d+\.\d+\.\d+/);
	});

	describe('with its database stopped', () => {
		let cluster: Cluster;
		let app: RunningApp;
		beforeAll(async () => {
			cluster = await makeCluster();
			await cluster.db('start');
			runScript('migrate', cluster.url);
			app = await startApp({ DATABASE_URL: cluster.url });
		});
		afterAll(async () => {
			await app?.stop();
			await cluster?.remove();
		});

		it('answers 503 while the database is down and ok again once it is back', async () => {
			expect((await fetch(`${app.baseURL}/healthz`)).status).toBe(200);
			await cluster.db('stop');
			const down = await fetch(`${app.baseURL}/healthz`);
			expect(down.status).toBe(503);
			const body = await down.json();
			expect(body.database.reachable).toBe(false);
			await cluster.db('start');
			let status = 0;
			for (let i = 0; i < 50 && status !== 200; i++) {
				status = (await fetch(`${app.baseURL}/healthz`)).status;
				if (status !== 200) await new Promise((r) => setTimeout(r, 100));
			}
			expect(status).toBe(200);
		});

		it('reports pending migrations as unavailable when the database is behind', async () => {
			const { default: postgres } = await import('postgres');
			const sql = postgres(cluster.url, { max: 1, onnotice: () => {} });
			// Pretend the newest migration was never applied.
			await sql`delete from drizzle.__drizzle_migrations where id = (select max(id) from drizzle.__drizzle_migrations)`;
			await sql.end();
			const res = await fetch(`${app.baseURL}/healthz`);
			expect(res.status).toBe(503);
			expect((await res.json()).migrations.pending).toBe(true);
		});
	});
});
