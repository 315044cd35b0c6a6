// Database helpers for integration and end-to-end tests (real PostgreSQL, throwaway cluster).
import { execFileSync } from 'node:child_process';
import postgres from 'postgres';
import { repoRoot } from './server';

export function requireEnv(name: string): string {
	const value = process.env[name];
	if (!value) throw new Error(`${name} is not set: run the tests through npm test`);
	return value;
}

/** Creates an empty database in the test cluster, owned by the app role; returns its URL. */
export async function createDatabase(name: string): Promise<string> {
	const superuser = postgres(requireEnv('PINCER_TEST_SUPERUSER_URL'), {
		max: 1,
		onnotice: () => {}
	});
	try {
		await superuser.unsafe(`drop database if exists "${name}" with (force)`);
		await superuser.unsafe(`create database "${name}" owner pincer`);
	} finally {
		await superuser.end();
	}
	const url = new URL(requireEnv('PINCER_IT_DATABASE_URL'));
	url.pathname = `/${name}`;
	return url.toString();
}

export async function dropDatabase(name: string): Promise<void> {
	const superuser = postgres(requireEnv('PINCER_TEST_SUPERUSER_URL'), {
		max: 1,
		onnotice: () => {}
	});
	try {
		await superuser.unsafe(`drop database if exists "${name}" with (force)`);
	} finally {
		await superuser.end();
	}
}

/** Runs one of the project's tsx scripts (migrate, seed) against a database. */
export function runScript(script: string, databaseUrl: string): string {
	return execFileSync(
		`${repoRoot}/node_modules/.bin/tsx`,
		['--tsconfig', 'scripts/tsconfig.json', `scripts/${script}.ts`],
		{
			cwd: repoRoot,
			env: { ...process.env, DATABASE_URL: databaseUrl },
			encoding: 'utf8',
			stdio: ['ignore', 'pipe', 'pipe']
		}
	);
}
