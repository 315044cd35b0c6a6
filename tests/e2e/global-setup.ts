import type { TestProject } from 'vitest/node';
import { requireEnv, runScript } from '../support/db';
import { startInbox, type RunningFake } from '../support/fakes';
import { startApp, type RunningApp } from '../support/server';

declare module 'vitest' {
	export interface ProvidedContext {
		baseURL: string;
		inboxURL: string;
	}
}

let app: RunningApp | undefined;
let inbox: RunningFake | undefined;

export async function setup(project: TestProject) {
	const databaseUrl = requireEnv('PINCER_E2E_DATABASE_URL');
	runScript('migrate', databaseUrl);
	runScript('seed', databaseUrl);
	inbox = await startInbox();
	app = await startApp({ DATABASE_URL: databaseUrl, ...inbox.env });
	project.provide('baseURL', app.baseURL);
	project.provide('inboxURL', inbox.urls.inbox);
}

export async function teardown() {
	await app?.stop();
	await inbox?.stop();
}
