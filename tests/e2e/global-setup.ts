import type { TestProject } from 'vitest/node';
import { requireEnv, runScript } from '../support/db';
import { startInbox, startStripeFake, type RunningFake } from '../support/fakes';
import { startApp, type RunningApp } from '../support/server';

declare module 'vitest' {
	export interface ProvidedContext {
		baseURL: string;
		inboxURL: string;
		stripeURL: string;
	}
}

let app: RunningApp | undefined;
let inbox: RunningFake | undefined;
let stripe: RunningFake | undefined;

export async function setup(project: TestProject) {
	const databaseUrl = requireEnv('PINCER_E2E_DATABASE_URL');
	runScript('migrate', databaseUrl);
	runScript('seed', databaseUrl);
	[inbox, stripe] = await Promise.all([startInbox(), startStripeFake()]);
	const stripeApi = new URL(stripe.urls.api);
	app = await startApp({
		DATABASE_URL: databaseUrl,
		...inbox.env,
		STRIPE_WEBHOOK_SECRET: stripe.env.STRIPE_WEBHOOK_SECRET,
		STRIPE_SECRET_KEY: 'sk_test_pincer_e2e',
		STRIPE_API_HOST: stripeApi.hostname,
		STRIPE_API_PORT: stripeApi.port,
		STRIPE_API_PROTOCOL: 'http'
	});
	// The app's port is known only now: tell the fake where to deliver webhooks.
	const pointed = await fetch(`${stripe.urls.api}/_fake/webhook-url`, {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify({ url: `${app.baseURL}/api/v1/webhooks/stripe` })
	});
	if (!pointed.ok) throw new Error(`the Stripe fake refused the webhook URL: ${pointed.status}`);
	project.provide('baseURL', app.baseURL);
	project.provide('inboxURL', inbox.urls.inbox);
	project.provide('stripeURL', stripe.urls.api);
}

export async function teardown() {
	await app?.stop();
	await Promise.all([inbox?.stop(), stripe?.stop()]);
}
