// The API's one error shape, { error: { code, message, fields?, requestId? } }, and the mapping
// from everything a handler can throw (our ApiError, SvelteKit's error(), zod issues) onto it.
import { isHttpError, isRedirect, json } from '@sveltejs/kit';
import type { z } from 'zod';
import type { apiErrorSchema } from '$lib/schemas/api';

export type ErrorCode = z.infer<typeof apiErrorSchema>['error']['code'];

/** Field path ("payments.3.date") to the problems found there; "" is the body or query itself. */
export type FieldProblems = Record<string, string[]>;

/** Thrown by API helpers and handlers; answered as JSON by apiCall. */
export class ApiError extends Error {
	constructor(
		readonly status: number,
		readonly code: ErrorCode,
		message: string,
		readonly fields?: FieldProblems,
		readonly headers?: Record<string, string>
	) {
		super(message);
	}
}

const codeOfStatus: Record<number, ErrorCode> = {
	400: 'invalid_query',
	401: 'unauthenticated',
	403: 'forbidden',
	404: 'not_found',
	409: 'conflict',
	413: 'payload_too_large',
	415: 'unsupported_media_type',
	429: 'rate_limited'
};

/** Zod issues keyed by dotted path; an unknown key is reported at its own path. */
export function fieldProblems(error: z.ZodError): FieldProblems {
	const fields: FieldProblems = {};
	const add = (path: PropertyKey[], message: string) => {
		const key = path.map(String).join('.');
		(fields[key] ??= []).push(message);
	};
	for (const issue of error.issues) {
		if (issue.code === 'unrecognized_keys') {
			for (const key of issue.keys) {
				add([...issue.path, key], 'Unknown field: the API reference lists the accepted fields.');
			}
		} else if (issue.code === 'invalid_union' && 'options' in issue && issue.options?.length) {
			add(issue.path, `Must be one of ${issue.options.map((o) => JSON.stringify(o)).join(', ')}.`);
		} else {
			add(issue.path, issue.message);
		}
	}
	return fields;
}

export function validationError(error: z.ZodError, where: 'body' | 'query'): ApiError {
	const fields = fieldProblems(error);
	const count = Object.values(fields).reduce((n, list) => n + list.length, 0);
	return where === 'body'
		? new ApiError(
				422,
				'validation_failed',
				`The body does not match the schema (${count} problem${count === 1 ? '' : 's'}).`,
				fields
			)
		: new ApiError(
				400,
				'invalid_query',
				`The query parameters are not valid (${count} problem${count === 1 ? '' : 's'}).`,
				fields
			);
}

/** Turns anything thrown in a handler into an ApiError; unexpected errors are logged with the request id. */
export function toApiError(err: unknown, requestId: string, where: string): ApiError {
	if (err instanceof ApiError) return err;
	if (isHttpError(err)) {
		const code = codeOfStatus[err.status] ?? (err.status >= 500 ? 'internal_error' : 'conflict');
		return new ApiError(err.status, code, err.body.message);
	}
	if (isRedirect(err)) return new ApiError(401, 'unauthenticated', 'Sign in or send an API key.');
	console.error(`[pincer] request ${requestId} ${where} failed:`, err);
	return new ApiError(
		500,
		'internal_error',
		`Something went wrong on our side. Quote request id ${requestId} when you report it.`
	);
}

export function errorResponse(problem: ApiError, requestId: string): Response {
	return json(
		{
			error: {
				code: problem.code,
				message: problem.message,
				...(problem.fields ? { fields: problem.fields } : {}),
				requestId
			}
		},
		{ status: problem.status, headers: problem.headers }
	);
}
