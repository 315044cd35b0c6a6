import { SvelteURLSearchParams } from 'svelte/reactivity';

/** The current query string with some parameters changed (undefined or '' removes one). */
export function changedQuery(
	current: URLSearchParams,
	changes: Record<string, string | number | undefined>
): string {
	const params = new SvelteURLSearchParams(current);
	for (const [key, value] of Object.entries(changes)) {
		if (value === undefined || value === '') params.delete(key);
		else params.set(key, String(value));
	}
	return params.toString();
}
