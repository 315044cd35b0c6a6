// Small HTTP helpers shared by the API, the hosted pages and the test controls.
import type { IncomingMessage, ServerResponse } from 'node:http';

/** An error answered in Stripe's shape: `{ error: { type, code, message, param } }`. */
export class ApiError extends Error {
	constructor(
		readonly status: number,
		readonly type: 'invalid_request_error' | 'card_error' | 'idempotency_error' | 'api_error',
		message: string,
		readonly code?: string,
		readonly param?: string
	) {
		super(message);
	}

	toJSON() {
		return {
			error: {
				type: this.type,
				message: this.message,
				...(this.code ? { code: this.code } : {}),
				...(this.param ? { param: this.param } : {})
			}
		};
	}
}

/** 400 for a referenced id that does not exist, 404 when it is the path's own id. */
export function noSuch(kind: string, id: string, param?: string): ApiError {
	return new ApiError(
		param ? 400 : 404,
		'invalid_request_error',
		`No such ${kind}: '${id}'`,
		'resource_missing',
		param ?? 'id'
	);
}

export function invalid(message: string, param?: string, code?: string): ApiError {
	return new ApiError(400, 'invalid_request_error', message, code, param);
}

const BODY_LIMIT = 1024 * 1024;

export async function readBody(req: IncomingMessage): Promise<string> {
	const chunks: Buffer[] = [];
	let size = 0;
	for await (const chunk of req) {
		size += (chunk as Buffer).length;
		if (size > BODY_LIMIT)
			throw new ApiError(413, 'invalid_request_error', 'Request body too large');
		chunks.push(chunk as Buffer);
	}
	return Buffer.concat(chunks).toString('utf8');
}

export function sendJson(
	res: ServerResponse,
	status: number,
	body: unknown,
	headers: Record<string, string> = {}
): void {
	res.writeHead(status, {
		'content-type': 'application/json; charset=utf-8',
		'cache-control': 'no-store',
		...headers
	});
	res.end(JSON.stringify(body, null, 2));
}

export function sendHtml(res: ServerResponse, status: number, html: string): void {
	res.writeHead(status, {
		'content-type': 'text/html; charset=utf-8',
		'cache-control': 'no-store',
		'content-security-policy': "default-src 'none'; style-src 'unsafe-inline'; img-src data:"
	});
	res.end(html);
}

/** 303 See Other: the browser follows with a GET. */
export function redirect(res: ServerResponse, location: string): void {
	res.writeHead(303, { location, 'cache-control': 'no-store' });
	res.end();
}
