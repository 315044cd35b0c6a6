// Starts the built app for end-to-end tests the way `npm start` serves it (scripts/serve.js,
// here with two worker processes), against a given database.
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { fileURLToPath } from 'node:url';

export const repoRoot = fileURLToPath(new URL('../..', import.meta.url));

export async function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const server = createServer();
		server.once('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const address = server.address();
			const port = typeof address === 'object' && address ? address.port : 0;
			server.close(() => resolve(port));
		});
	});
}

export type RunningApp = { baseURL: string; process: ChildProcess; stop: () => Promise<void> };

/** Serves build/ on a free loopback port and resolves once /healthz answers. */
export async function startApp(env: Record<string, string>): Promise<RunningApp> {
	const port = await freePort();
	const baseURL = `http://127.0.0.1:${port}`;
	const child = spawn(process.execPath, ['scripts/serve.js'], {
		cwd: repoRoot,
		env: {
			...process.env,
			PINCER_WORKERS: '2',
			HOST: '127.0.0.1',
			PORT: String(port),
			ORIGIN: baseURL,
			...env
		},
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let output = '';
	child.stdout?.on('data', (chunk) => (output += chunk));
	child.stderr?.on('data', (chunk) => (output += chunk));
	const deadline = Date.now() + 30_000;
	while (Date.now() < deadline) {
		if (child.exitCode !== null) throw new Error(`app exited during start-up:\n${output}`);
		try {
			const res = await fetch(`${baseURL}/healthz`);
			if (res.status === 200 || res.status === 503) break;
		} catch {
			// not listening yet
		}
		await new Promise((r) => setTimeout(r, 100));
	}
	const stop = async () => {
		if (child.exitCode !== null) return;
		const exited = new Promise((r) => child.once('exit', r));
		child.kill('SIGTERM');
		await Promise.race([exited, new Promise((r) => setTimeout(r, 10_000))]);
		if (child.exitCode === null) child.kill('SIGKILL');
	};
	return { baseURL, process: child, stop };
}
