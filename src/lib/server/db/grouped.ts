// Grouping of calls that share a key while a database round trip for that key is under way.
// A busy event loop makes every round trip wait its turn, so one statement per call kept hot
// rows and locks (a key's request counter, a workspace's audit chain) busy far longer than their
// work. Calls of one key that arrive while its statement runs wait for the next one, which
// serves all of them. An idle server sends a lone call at once, so grouping adds no delay.

type Waiting<T, R> = { item: T; resolve: (result: R) => void; reject: (err: unknown) => void };

type Limits<T> = {
	/** Most items one flush takes. */
	items: number;
	/** Most total weight one flush takes (one item always goes, whatever it weighs). */
	weight?: { of: (item: T) => number; max: number };
};

/**
 * A function that serves each call through `flush(key, items)`, which must answer one result per
 * item, in order. At most one flush per key runs at a time in this process, with as many waiting
 * items as `limits` allow.
 */
export function grouped<T, R>(
	flush: (key: string, items: T[]) => Promise<R[]>,
	limits: Limits<T>
): (key: string, item: T) => Promise<R> {
	const queues = new Map<string, Waiting<T, R>[]>();

	function take(queue: Waiting<T, R>[]): Waiting<T, R>[] {
		let count = Math.min(queue.length, limits.items);
		if (limits.weight) {
			let total = limits.weight.of(queue[0].item);
			for (let i = 1; i < count; i += 1) {
				total += limits.weight.of(queue[i].item);
				if (total > limits.weight.max) {
					count = i;
					break;
				}
			}
		}
		return queue.splice(0, count);
	}

	async function drain(key: string, queue: Waiting<T, R>[]) {
		try {
			while (queue.length > 0) {
				const group = take(queue);
				try {
					const results = await flush(
						key,
						group.map((w) => w.item)
					);
					group.forEach((w, i) => w.resolve(results[i]));
				} catch (err) {
					for (const w of group) w.reject(err);
				}
			}
		} finally {
			queues.delete(key);
		}
	}

	return (key, item) =>
		new Promise<R>((resolve, reject) => {
			const waiting = queues.get(key);
			if (waiting) {
				waiting.push({ item, resolve, reject });
				return;
			}
			const queue = [{ item, resolve, reject }];
			queues.set(key, queue);
			void drain(key, queue);
		});
}
