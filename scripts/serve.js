// Serves the built app (build/) with one Node process per core, or PINCER_WORKERS of them.
// Solving is CPU work and one Node process uses one core, so a single process left the other
// cores to PostgreSQL alone. The workers share the port through node:cluster and keep no state
// of their own: sessions are signed cookies; rate limits, the audit chain's lock and everything
// else live in PostgreSQL. SIGTERM or SIGINT drains every worker (adapter-node finishes the
// requests in flight and closes the database pool), then the primary exits.
import cluster from 'node:cluster';
import { availableParallelism } from 'node:os';

const server = new URL('../build/index.js', import.meta.url).href;
const wanted = Number(process.env.PINCER_WORKERS);
const count = Number.isInteger(wanted) && wanted > 0 ? wanted : availableParallelism();

/**
 * Node options of the workers: the primary's, with a 64 MB young generation (V8's default is
 * 16 MB) unless one is given. An API solve allocates about 1 MB and many wait on PostgreSQL
 * across a scavenge; a bigger young generation scavenges a quarter as often and promotes less
 * to the old one (bench:api: about 5% less CPU per call).
 */
function workerArgs() {
	const given = [...process.execArgv, ...(process.env.NODE_OPTIONS ?? '').split(/\s+/)];
	if (given.some((arg) => arg.startsWith('--max-semi-space-size'))) return process.execArgv;
	return [...process.execArgv, '--max-semi-space-size=64'];
}

if (count === 1 || !cluster.isPrimary) {
	// adapter-node announces the end of its graceful shutdown; a worker then lets go of its
	// channel to the primary, which would otherwise keep it alive.
	if (cluster.isWorker) process.once('sveltekit:shutdown', () => cluster.worker?.disconnect());
	await import(server);
} else {
	const log = (text) => console.error(`[pincer] ${text}`);
	const started = new Set();
	let stopping = false;

	const fork = () => {
		const worker = cluster.fork();
		worker.once('listening', () => {
			started.add(worker);
			if (started.size === count) log(`serving with ${count} worker processes`);
		});
		worker.once('exit', (code, signal) => {
			if (stopping) {
				if (Object.keys(cluster.workers ?? {}).length === 0) process.exit();
				return;
			}
			if (!started.delete(worker)) {
				// A worker that cannot start (bad configuration, port taken) will not start twice.
				log(`a worker exited during start-up (code ${code}, signal ${signal}); stopping`);
				stop(1);
				return;
			}
			log(`worker ${worker.process.pid} exited (code ${code}, signal ${signal}); starting another`);
			fork();
		});
	};

	const stop = (code = 0) => {
		if (stopping) return;
		stopping = true;
		const workers = Object.values(cluster.workers ?? {});
		process.exitCode = code;
		if (workers.length === 0) process.exit();
		for (const worker of workers) worker.process.kill('SIGTERM');
	};

	process.on('SIGTERM', () => stop());
	process.on('SIGINT', () => stop());
	cluster.setupPrimary({ execArgv: workerArgs() });
	for (let i = 0; i < count; i += 1) fork();
}
