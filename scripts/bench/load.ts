/**
 * A small bounded HTTP load generator: `connections` keep-alive connections, each sending its
 * next request as soon as the previous answer is read, for `seconds`. Latency is measured per
 * request from send to the last byte of the answer. Loopback use only.
 */
import http from 'node:http';

export type LoadTarget = {
	url: string;
	method: 'GET' | 'POST';
	headers?: Record<string, string>;
	body?: string;
};

export type LoadResult = {
	requests: number;
	/** Answers with a status other than 2xx, and failed requests (timeouts, resets). */
	failures: number;
	statuses: Record<string, number>;
	seconds: number;
	/** Successful (2xx) answers per second. */
	perSecond: number;
	p50: number;
	p99: number;
	max: number;
};

const REQUEST_TIMEOUT_MS = 10_000;

function percentile(sorted: Float64Array, p: number): number {
	if (sorted.length === 0) return NaN;
	return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

function once(agent: http.Agent, target: LoadTarget, body: Buffer | null): Promise<number> {
	return new Promise((resolve) => {
		const request = http.request(
			target.url,
			{
				method: target.method,
				agent,
				headers: {
					...target.headers,
					...(body ? { 'content-length': String(body.byteLength) } : {})
				},
				timeout: REQUEST_TIMEOUT_MS
			},
			(response) => {
				response.resume();
				response.on('end', () => resolve(response.statusCode ?? 0));
				response.on('error', () => resolve(0));
			}
		);
		request.on('timeout', () => request.destroy(new Error('timeout')));
		request.on('error', () => resolve(0));
		request.end(body ?? undefined);
	});
}

/** Runs the load for `seconds` (plus at most one request timeout) and summarises it. */
export async function runLoad(
	target: LoadTarget,
	connections: number,
	seconds: number
): Promise<LoadResult> {
	const agent = new http.Agent({ keepAlive: true, maxSockets: connections });
	const body = target.body === undefined ? null : Buffer.from(target.body);
	const latencies: number[] = [];
	const statuses: Record<string, number> = {};
	let failures = 0;
	const started = performance.now();
	const deadline = started + seconds * 1000;
	const worker = async () => {
		while (performance.now() < deadline) {
			const sent = performance.now();
			const status = await once(agent, target, body);
			latencies.push(performance.now() - sent);
			statuses[status] = (statuses[status] ?? 0) + 1;
			if (status < 200 || status >= 300) failures += 1;
		}
	};
	await Promise.all(Array.from({ length: connections }, worker));
	const elapsed = (performance.now() - started) / 1000;
	agent.destroy();
	const sorted = Float64Array.from(latencies).sort();
	return {
		requests: latencies.length,
		failures,
		statuses,
		seconds: elapsed,
		perSecond: (latencies.length - failures) / elapsed,
		p50: percentile(sorted, 50),
		p99: percentile(sorted, 99),
		max: sorted.length ? sorted[sorted.length - 1] : NaN
	};
}
