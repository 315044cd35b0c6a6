// Glue between our form actions and Auth.js: after our action has validated the form (and, for
// passwords, checked the rate limit), it asks Auth.js to mint the session cookie. This mirrors
// what @auth/sveltekit's own signIn action does, without re-reading the request body.
import { Auth, raw, setEnvDefaults, skipCSRFCheck, type AuthConfig } from '@auth/core';
import type { RequestEvent } from '@sveltejs/kit';
import { env } from '$env/dynamic/private';
import { authConfig } from './config';

async function callAuth(event: RequestEvent, path: string, fields: Record<string, string>) {
	const config: AuthConfig = { ...authConfig(), basePath: '/auth' };
	// SvelteKit's own Origin check guards our form actions, as it does for @auth/sveltekit.
	config.skipCSRFCheck = skipCSRFCheck;
	setEnvDefaults(env, config);
	const headers = new Headers(event.request.headers);
	headers.set('content-type', 'application/x-www-form-urlencoded');
	const request = new Request(new URL(`/auth/${path}`, event.url.origin), {
		method: 'POST',
		headers,
		body: new URLSearchParams(fields)
	});
	const response = await Auth(request, { ...config, raw });
	for (const cookie of response.cookies ?? []) {
		event.cookies.set(cookie.name, cookie.value, { path: '/', ...cookie.options });
	}
	return response.redirect ?? '';
}

/** Signs in with e-mail and password; true when Auth.js accepted them and set the session. */
export async function startPasswordSession(event: RequestEvent, email: string, password: string) {
	try {
		const redirect = await callAuth(event, 'callback/credentials', {
			email,
			password,
			callbackUrl: '/app'
		});
		return !redirect.includes('error=');
	} catch (err) {
		// Matched by name: the bundled server may hold a second copy of the error class.
		if ((err as { type?: string }).type === 'CredentialsSignin') return false;
		throw err;
	}
}

/** Sends a one-time sign-in link (Auth.js stores its hash in verification_tokens). */
export async function sendSignInLink(event: RequestEvent, email: string, next: string) {
	await callAuth(event, 'signin/nodemailer', { email, callbackUrl: next });
}

/** Ends the session (clears the Auth.js cookie). */
export async function endSession(event: RequestEvent) {
	await callAuth(event, 'signout', { callbackUrl: '/' });
}
