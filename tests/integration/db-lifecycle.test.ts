import { execFileSync } from 'node:child_process';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { makeCluster, type Cluster } from '../support/cluster';

function serverProcesses(dataDir: string): string[] {
	const out = execFileSync('ps', ['-eo', 'args'], { encoding: 'utf8' });
	return out.split('\n').filter((line) => line.includes(`-D ${dataDir}`));
}

describe('scripts/db.sh lifecycle', () => {
	let cluster: Cluster;
	beforeAll(async () => {
		cluster = await makeCluster();
	});
	afterAll(async () => {
		await cluster.remove();
	});

	it('starts, and a second start is a no-op that keeps the same server', async () => {
		expect((await cluster.db('start')).code).toBe(0);
		const first = serverProcesses(cluster.dataDir);
		expect(first).toHaveLength(1);
		const again = await cluster.db('start');
		expect(again.code).toBe(0);
		expect(again.stderr).toContain('already running');
		expect(serverProcesses(cluster.dataDir)).toEqual(first);
		expect((await cluster.db('status')).stdout).toContain('running');
	});

	it('keeps data across stop and start, and stop leaves no server', async () => {
		const sql = postgres(cluster.url, { max: 1, onnotice: () => {} });
		await sql`create table kept (note text)`;
		await sql`insert into kept values ('survives a restart')`;
		await sql.end();

		expect((await cluster.db('stop')).code).toBe(0);
		expect(serverProcesses(cluster.dataDir)).toHaveLength(0);
		const status = await cluster.db('status');
		expect(status.code).toBe(3);
		expect(status.stdout).toContain('stopped');
		expect((await cluster.db('stop')).code).toBe(0); // stopping twice is fine

		expect((await cluster.db('start')).code).toBe(0);
		const again = postgres(cluster.url, { max: 1, onnotice: () => {} });
		const rows = await again`select note from kept`;
		await again.end();
		expect(rows.map((r) => r.note)).toEqual(['survives a restart']);
	});

	it('refuses a port that is taken with a one-line reason, leaving the data folder intact', async () => {
		const other = await makeCluster();
		try {
			// Point the second cluster at the first one's port.
			const { execFile } = await import('node:child_process');
			const result = await new Promise<{ code: number; stderr: string }>((resolve) => {
				execFile(
					'bash',
					['scripts/db.sh', 'start'],
					{
						cwd: process.cwd(),
						env: {
							...process.env,
							PINCER_PGDATA: other.dataDir,
							PGPORT: String(cluster.port),
							PINCER_DB_SUPERPASSWORD: 'x',
							PINCER_DB_PASSWORD: 'y'
						}
					},
					(err, _stdout, stderr) => resolve({ code: err ? Number(err.code) : 0, stderr })
				);
			});
			expect(result.code).not.toBe(0);
			expect(result.stderr).toMatch(/port \d+ is taken/);
			expect(serverProcesses(cluster.dataDir)).toHaveLength(1);
		} finally {
			await other.remove();
		}
	});
});
