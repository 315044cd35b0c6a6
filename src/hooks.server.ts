import type { Handle, HandleServerError } from '@sveltejs/kit';
import { sequence } from '@sveltejs/kit/hooks';

const requestId: Handle = async ({ event, resolve }) => {
	event.locals.requestId = event.request.headers.get('x-request-id') ?? crypto.randomUUID();
	const response = await resolve(event);
	response.headers.set('x-request-id', event.locals.requestId);
	return response;
};

// The Content-Security-Policy itself comes from kit.csp in svelte.config.js.
const securityHeaders: Handle = async ({ event, resolve }) => {
	const response = await resolve(event);
	response.headers.set('x-content-type-options', 'nosniff');
	response.headers.set('referrer-policy', 'strict-origin-when-cross-origin');
	response.headers.set('x-frame-options', 'DENY');
	response.headers.set('permissions-policy', 'camera=(), microphone=(), geolocation=()');
	if (!response.headers.has('content-security-policy')) {
		// Non-HTML responses (JSON, files) get a strict policy of their own.
		response.headers.set('content-security-policy', "default-src 'none'; frame-ancestors 'none'");
	}
	return response;
};

export const handle = sequence(requestId, securityHeaders);

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
