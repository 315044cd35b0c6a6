// Grouping of calls that share a key while a database round trip for that key is under way.
// A busy event loop makes every round trip wait its turn, so one statement per call kept hot
// rows and locks (a key's request counter, a workspace's audit chain) busy far longer than their
// work. Calls of one key that arrive while its statement runs wait for the next one, which
// serves all of them. An idle server sends a lone call at once, so grouping adds no delay.

type Waiting<T, R> = { item: T; resolve: (result: R) => void; reject: (err: unknown) => void };

/**
 * A function that serves each call through `flush(key, items)`, which must answer one result per
 * item, in order. At most one flush per key runs at a time in this process; at most `maxGroup`
 * items go to one flush.
 */
export function grouped<T, R>(
	flush: (key: string, items: T[]) => Promise<R[]>,
	maxGroup: number
): (key: string, item: T) => Promise<R> {
	const queues = new Map<string, Waiting<T, R>[]>();

	async function drain(key: string, queue: Waiting<T, R>[]) {
		try {
			while (queue.length > 0) {
				const group = queue.splice(0, maxGroup);
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
