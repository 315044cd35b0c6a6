/** Median wall time in milliseconds of `run` over `samples` runs, after `warmup` runs. */
export function medianMs(run: () => unknown, samples: number, warmup = 3): number {
	for (let i = 0; i < warmup; i += 1) run();
	const times: number[] = [];
	for (let i = 0; i < samples; i += 1) {
		const start = performance.now();
		run();
		times.push(performance.now() - start);
	}
	times.sort((a, b) => a - b);
	const mid = Math.floor(times.length / 2);
	return times.length % 2 === 1 ? times[mid] : (times[mid - 1] + times[mid]) / 2;
}

/** A small deterministic generator (linear congruential), so every run benches the same data. */
export function seededRandom(seed: number): () => number {
	let state = seed >>> 0;
	return () => {
		state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
		return state / 2 ** 32;
	};
}

export function isoDate(year: number, month: number, day: number): string {
	return new Date(Date.UTC(year, month - 1, day)).toISOString().slice(0, 10);
}

export function addDays(iso: string, days: number): string {
	const [y, m, d] = iso.split('-').map(Number);
	return isoDate(y, m, d + days);
}

export function formatTable(header: string[], rows: string[][]): string {
	const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
	const line = (cells: string[]) => cells.map((c, i) => c.padEnd(widths[i])).join('  ');
	return [line(header), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}
