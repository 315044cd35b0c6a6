// The app's version: injected by vite.config.ts in the app and tests, read from npm in scripts.
export const appVersion: string =
	typeof __PINCER_VERSION__ !== 'undefined'
		? __PINCER_VERSION__
		: (process.env.npm_package_version ?? 'dev');
