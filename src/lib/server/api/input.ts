// Reading a request's JSON body and query string at the API boundary. The server itself accepts
// bodies up to BODY_SIZE_LIMIT (12 MB, room for uploads), so the API's own 5 MB limit is checked
// here: first the declared Content-Length, then the bytes actually read.
import type { z } from 'zod';
import { ApiError, validationError } from './errors';

export const MAX_BODY_BYTES = 5 * 1024 * 1024;

const JSON_TYPE = /^application\/json\s*(;|$)/i;

const tooLarge = () =>
	new ApiError(
		413,
		'payload_too_large',
		`The body is larger than ${MAX_BODY_BYTES / 1024 / 1024} MB; send fewer flows per call.`
	);

const serverLimit = () =>
	new ApiError(
		413,
		'payload_too_large',
		'The body is larger than this server accepts (its BODY_SIZE_LIMIT).'
	);

/**
 * Reads what is left of a body without keeping it (the server stops at BODY_SIZE_LIMIT):
 * cancelling instead would reset the connection before the client could read our 413.
 */
async function discardRest(reader: ReadableStreamDefaultReader<Uint8Array>) {
	while (!(await reader.read().catch(() => ({ done: true }))).done);
}

async function readText(request: Request, limit: number): Promise<string> {
	if (!request.body) return '';
	const reader = request.body.getReader();
	const chunks: Uint8Array[] = [];
	let size = 0;
	for (;;) {
		const { done, value } = await reader.read().catch((err: { status?: number }) => {
			// The server's own BODY_SIZE_LIMIT ends the stream with a 413 error.
			if (err?.status === 413) throw serverLimit();
			throw new ApiError(400, 'malformed_json', 'The body could not be read to its end.');
		});
		if (done) break;
		size += value.byteLength;
		if (size > limit) {
			await discardRest(reader);
			throw tooLarge();
		}
		chunks.push(value);
	}
	const bytes = new Uint8Array(size);
	let offset = 0;
	for (const chunk of chunks) {
		bytes.set(chunk, offset);
		offset += chunk.byteLength;
	}
	try {
		return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
	} catch {
		throw new ApiError(400, 'malformed_json', 'The body is not valid UTF-8 text.');
	}
}

/** The body parsed as JSON and validated by `schema`: 415, 413, 400 or 422 otherwise. */
export async function readJson<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<z.output<S>> {
	return (await readJsonText(request, schema)).value;
}

/**
 * readJson, with the body's text as received. For a schema without transforms or defaults the
 * text holds exactly the validated value, so it can be stored as it is.
 */
export async function readJsonText<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<{ value: z.output<S>; text: string }> {
	if (!JSON_TYPE.test(request.headers.get('content-type') ?? '')) {
		throw new ApiError(
			415,
			'unsupported_media_type',
			'Send the body as JSON with the header Content-Type: application/json.'
		);
	}
	const declared = Number(request.headers.get('content-length'));
	if (Number.isFinite(declared) && declared > MAX_BODY_BYTES) {
		if (request.body) await discardRest(request.body.getReader());
		throw tooLarge();
	}
	const text = await readText(request, MAX_BODY_BYTES);
	let data: unknown;
	try {
		data = JSON.parse(text);
	} catch (err) {
		throw new ApiError(
			400,
			'malformed_json',
			text.trim() ? `The body is not valid JSON: ${(err as Error).message}` : 'The body is empty.'
		);
	}
	const parsed = schema.safeParse(data);
	if (!parsed.success) throw validationError(parsed.error, 'body');
	return { value: parsed.data, text };
}

/** The query string validated by `schema` (a strict object, so unknown parameters are refused). */
export function readQuery<S extends z.ZodType>(url: URL, schema: S): z.output<S> {
	const parsed = schema.safeParse(Object.fromEntries(url.searchParams));
	if (!parsed.success) throw validationError(parsed.error, 'query');
	return parsed.data;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A path id that is a UUID, else 404 (an id that cannot exist is simply not found). */
export function pathId(value: string | undefined): string {
	if (!value || !UUID.test(value)) throw notFound();
	return value.toLowerCase();
}

export const notFound = () => new ApiError(404, 'not_found', 'Not found in this workspace.');
