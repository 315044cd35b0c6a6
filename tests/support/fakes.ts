// Starts the local fakes (fakes/<name>/server.ts) on free ports for end-to-end tests.
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { freePort, repoRoot } from './server';

export type RunningFake = {
	env: Record<string, string>;
	urls: Record<string, string>;
	stop: () => Promise<void>;
};

async function waitForReady(child: ChildProcess, name: string): Promise<void> {
	let output = '';
	await new Promise<void>((resolve, reject) => {
		const timer = setTimeout(
			() => reject(new Error(`${name} fake did not start:\n${output}`)),
			20_000
		);
		const onData = (chunk: Buffer) => {
			output += chunk;
			if (output.includes('ready')) {
				clearTimeout(timer);
				resolve();
			}
		};
		child.stdout?.on('data', onData);
		child.stderr?.on('data', (chunk) => (output += chunk));
		child.once('exit', (code) => {
			clearTimeout(timer);
			reject(new Error(`${name} fake exited with ${code}:\n${output}`));
		});
	});
}

function stopper(child: ChildProcess) {
	return async () => {
		if (child.exitCode !== null) return;
		const exited = new Promise((r) => child.once('exit', r));
		child.kill('SIGTERM');
		await Promise.race([exited, new Promise((r) => setTimeout(r, 5_000))]);
	};
}

export async function startInbox(): Promise<RunningFake> {
	const smtpPort = await freePort();
	const webPort = await freePort();
	const child = spawn(`${repoRoot}/node_modules/.bin/tsx`, ['fakes/inbox/server.ts'], {
		cwd: repoRoot,
		env: { ...process.env, PINCER_SMTP_PORT: String(smtpPort), PINCER_INBOX_PORT: String(webPort) },
		stdio: ['ignore', 'pipe', 'pipe']
	});
	await waitForReady(child, 'inbox');
	return {
		env: { SMTP_URL: `smtp://127.0.0.1:${smtpPort}` },
		urls: { inbox: `http://127.0.0.1:${webPort}` },
		stop: stopper(child)
	};
}

/**
 * The local Stripe (fakes/stripe) on a free port. Point the SDK at `urls.api` (host 127.0.0.1,
 * that port, protocol http); webhooks go to `webhookUrl`, signed with `env.STRIPE_WEBHOOK_SECRET`.
 */
export async function startStripeFake(
	options: { webhookUrl?: string; webhookSecret?: string } = {}
): Promise<RunningFake> {
	const port = await freePort();
	const secret = options.webhookSecret ?? `whsec_${randomBytes(24).toString('hex')}`;
	const child = spawn(`${repoRoot}/node_modules/.bin/tsx`, ['fakes/stripe/server.ts'], {
		cwd: repoRoot,
		env: {
			...process.env,
			PINCER_STRIPE_PORT: String(port),
			PINCER_STRIPE_WEBHOOK_URL: options.webhookUrl ?? '',
			PINCER_STRIPE_PUBLIC_URL: '',
			STRIPE_WEBHOOK_SECRET: secret
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	await waitForReady(child, 'stripe');
	return {
		env: { STRIPE_WEBHOOK_SECRET: secret, PINCER_STRIPE_PORT: String(port) },
		urls: { api: `http://127.0.0.1:${port}` },
		stop: stopper(child)
	};
}
