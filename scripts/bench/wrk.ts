/**
 * HTTP load from a second process with wrk (Debian's package, installed when missing): keep-alive
 * connections, each sending its next request as soon as the answer is read. Latency percentiles
 * are wrk's own; the CPU wrk used is read from this process's reaped-children times in /proc.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export type LoadTarget = {
	url: string;
	method: 'GET' | 'POST';
	headers?: Record<string, string>;
	body?: string;
};

export type LoadResult = {
	requests: number;
	/** Answers with a status other than 2xx or 3xx, and socket errors. */
	failures: number;
	seconds: number;
	/** Successful answers per second. */
	perSecond: number;
	p50: number;
	p99: number;
	max: number;
	/** CPU time wrk used (user + system), ms. */
	cpu: number;
};

/** Installs Debian's wrk through the project's own helper when it is not on this machine. */
export function ensureWrk(root: string) {
	if (spawnSync('wrk', ['--version']).error === undefined) return;
	execFileSync('bash', ['-c', 'source scripts/lib.sh && apt_install wrk'], {
		cwd: root,
		stdio: 'inherit'
	});
}

/** CPU (ms) of this process's children that have ended and been waited for. */
function reapedChildrenCpu(): number {
	const stat = readFileSync('/proc/self/stat', 'utf8');
	const fields = stat.slice(stat.lastIndexOf(') ') + 2).split(' ');
	return ((Number(fields[13]) + Number(fields[14])) * 1000) / 100;
}

const UNIT_MS: Record<string, number> = { us: 0.001, ms: 1, s: 1000, m: 60_000 };

function toMs(text: string): number {
	const match = /^([\d.]+)(us|ms|s|m)$/.exec(text);
	if (!match) throw new Error(`wrk printed a latency this script cannot read: ${text}`);
	return Number(match[1]) * UNIT_MS[match[2]];
}

const lua = (value: string) => JSON.stringify(value); // JSON string escapes are valid Lua ones

export function runWrk(target: LoadTarget, connections: number, seconds: number): LoadResult {
	const folder = mkdtempSync(join(tmpdir(), 'pincer-wrk-'));
	try {
		const lines = [`wrk.method = ${lua(target.method)}`];
		for (const [name, value] of Object.entries(target.headers ?? {})) {
			lines.push(`wrk.headers[${lua(name)}] = ${lua(value)}`);
		}
		if (target.body !== undefined) {
			writeFileSync(join(folder, 'body.json'), target.body);
			lines.push(`local file = io.open(${lua(join(folder, 'body.json'))}, "rb")`);
			lines.push('wrk.body = file:read("*a")', 'file:close()');
		}
		writeFileSync(join(folder, 'request.lua'), lines.join('\n'));
		const cpuBefore = reapedChildrenCpu();
		const run = spawnSync(
			'wrk',
			[
				'--threads',
				'2',
				'--connections',
				String(connections),
				'--duration',
				`${seconds}s`,
				'--timeout',
				'10s',
				'--latency',
				'--script',
				join(folder, 'request.lua'),
				target.url
			],
			{ encoding: 'utf8' }
		);
		const cpu = reapedChildrenCpu() - cpuBefore;
		if (run.status !== 0) throw new Error(`wrk failed:\n${run.stderr || run.stdout}`);
		const out = run.stdout;
		if (process.env.PINCER_BENCH_VERBOSE) console.error(out);
		const find = (pattern: RegExp) => {
			const match = pattern.exec(out);
			if (!match) throw new Error(`wrk's report lacks ${pattern}:\n${out}`);
			return match;
		};
		const latency = find(/Latency\s+(\S+)\s+(\S+)\s+(\S+)/);
		const total = find(/(\d+) requests in ([\d.]+)(us|ms|s|m)/);
		const requests = Number(total[1]);
		const elapsed = toMs(`${total[2]}${total[3]}`) / 1000;
		const non2xx = Number(/Non-2xx or 3xx responses: (\d+)/.exec(out)?.[1] ?? 0);
		const socket = /Socket errors: connect (\d+), read (\d+), write (\d+), timeout (\d+)/.exec(out);
		const socketErrors = socket ? socket.slice(1).reduce((sum, n) => sum + Number(n), 0) : 0;
		return {
			requests,
			failures: non2xx + socketErrors,
			seconds: elapsed,
			perSecond: (requests - non2xx) / elapsed,
			p50: toMs(find(/^\s+50%\s+(\S+)/m)[1]),
			p99: toMs(find(/^\s+99%\s+(\S+)/m)[1]),
			max: toMs(latency[3]),
			cpu
		};
	} finally {
		rmSync(folder, { recursive: true, force: true });
	}
}
