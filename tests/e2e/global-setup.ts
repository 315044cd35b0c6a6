import type { TestProject } from 'vitest/node';
import { requireEnv, runScript } from '../support/db';
import { startApp, type RunningApp } from '../support/server';

declare module 'vitest' {
	export interface ProvidedContext {
		baseURL: string;
	}
}

let app: RunningApp | undefined;

export async function setup(project: TestProject) {
	const databaseUrl = requireEnv('PINCER_E2E_DATABASE_URL');
	runScript('migrate', databaseUrl);
	runScript('seed', databaseUrl);
	app = await startApp({ DATABASE_URL: databaseUrl });
	project.provide('baseURL', app.baseURL);
}

export async function teardown() {
	await app?.stop();
}
