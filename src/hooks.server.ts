import type { Handle, HandleServerError } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';
import { authHandle } from '$lib/server/auth';

const REQUEST_ID = /^[\w-]{8,64}$/;

const SECURITY_HEADERS: Record<string, string> = {
	'x-content-type-options': 'nosniff',
	'referrer-policy': 'strict-origin-when-cross-origin',
	'x-frame-options': 'DENY',
	'permissions-policy': 'camera=(), microphone=(), geolocation=()'
};

/**
 * Gives every request an id (kept from a well-formed x-request-id header) and every response
 * our security headers. The Content-Security-Policy of pages comes from kit.csp in
 * svelte.config.js; other responses (JSON, files, redirects) get a strict one here.
 */
const requestIdAndHeaders: Handle = async ({ event, resolve }) => {
	const given = event.request.headers.get('x-request-id');
	event.locals.requestId = given && REQUEST_ID.test(given) ? given : crypto.randomUUID();
	let response = await resolve(event);
	try {
		response.headers.set('x-request-id', event.locals.requestId);
	} catch {
		// Responses made with Response.redirect() (Auth.js uses them) have immutable headers.
		response = new Response(response.body, response);
		response.headers.set('x-request-id', event.locals.requestId);
	}
	for (const [name, value] of Object.entries(SECURITY_HEADERS)) response.headers.set(name, value);
	if (!response.headers.has('content-security-policy')) {
		response.headers.set('content-security-policy', "default-src 'none'; frame-ancestors 'none'");
	}
	return response;
};

export const handle = sequence(requestIdAndHeaders, authHandle);

export const handleError: HandleServerError = ({ error, event, status, message }) => {
	const id = event.locals.requestId ?? crypto.randomUUID();
	if (status !== 404) {
		console.error(
			`[pincer] request ${id} ${event.request.method} ${event.url.pathname} failed:`,
			error
		);
	}
	return { message: status === 404 ? 'Not found' : message, requestId: id };
};
