// See https://svelte.dev/docs/kit/types#app.d.ts
declare global {
	/** The package version, injected by vite.config.ts. */
	const __PINCER_VERSION__: string;

	namespace App {
		interface Error {
			message: string;
			requestId?: string;
		}
		interface Locals {
			requestId: string;
			/** Memoised by getActor() in $lib/server/auth/guards. */
			actor?: Promise<import('$lib/server/auth/guards').Actor | null>;
		}
	}
}

export {};
