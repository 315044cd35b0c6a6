import { describe, expect, it } from 'vitest';
import { grouped } from './grouped';

/** A flush that records its groups; `release()` answers every flush still pending. */
function recorder() {
	const groups: { key: string; items: number[] }[] = [];
	let pending: (() => void)[] = [];
	const flush = (key: string, items: number[]) => {
		groups.push({ key, items });
		return new Promise<number[]>((resolve, reject) => {
			pending.push(() =>
				items.includes(-1) ? reject(new Error('refused')) : resolve(items.map((n) => n * 10))
			);
		});
	};
	const release = () => {
		const now = pending;
		pending = [];
		for (const answer of now) answer();
	};
	return { groups, flush, release };
}

const tick = () => new Promise((r) => setTimeout(r, 0));

describe('grouped', () => {
	it('sends a lone call at once and groups the calls that arrive meanwhile, in order', async () => {
		const r = recorder();
		const call = grouped(r.flush, { items: 10 });
		const first = call('a', 1);
		const rest = [2, 3, 4].map((n) => call('a', n));
		expect(r.groups).toEqual([{ key: 'a', items: [1] }]);
		r.release();
		expect(await first).toBe(10);
		await tick();
		expect(r.groups[1]).toEqual({ key: 'a', items: [2, 3, 4] });
		r.release();
		expect(await Promise.all(rest)).toEqual([20, 30, 40]);
	});

	it('keeps keys apart and bounds a group by count and by weight', async () => {
		const r = recorder();
		const call = grouped(r.flush, { items: 3, weight: { of: (n) => n, max: 10 } });
		const results = [
			call('a', 1),
			call('b', 2),
			call('a', 4),
			call('a', 5),
			call('a', 20),
			call('a', 1)
		];
		expect(r.groups.map((g) => g.key)).toEqual(['a', 'b']);
		for (let i = 0; i < 6; i += 1) {
			r.release();
			await tick();
		}
		await Promise.all(results);
		// 4 + 5 fit in 10, 20 exceeds it and goes alone, then the last 1.
		expect(r.groups.filter((g) => g.key === 'a').map((g) => g.items)).toEqual([
			[1],
			[4, 5],
			[20],
			[1]
		]);
	});

	it('a refused group fails its own calls only', async () => {
		const r = recorder();
		const call = grouped(r.flush, { items: 10 });
		const first = call('a', 1);
		const refused = [call('a', -1), call('a', 2)];
		r.release();
		await first;
		await tick();
		r.release();
		await expect(refused[0]).rejects.toThrow('refused');
		await expect(refused[1]).rejects.toThrow('refused');
		const later = call('a', 3);
		r.release();
		expect(await later).toBe(30);
	});
});
