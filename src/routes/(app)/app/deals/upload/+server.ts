import { error, json } from '@sveltejs/kit';
import { z } from 'zod';
import { requireRole, writers } from '$lib/server/auth';
import { inspectUpload, MAX_UPLOAD_BYTES, readFlows } from '$lib/server/deals/upload';
import type { RequestHandler } from './$types';

const column = z.coerce.number().int().min(0).max(10_000).optional();
const mappingSchema = z.object({
	step: z.enum(['inspect', 'read']),
	mode: z.enum(['dated', 'periodic']).default('dated'),
	signConvention: z.enum(['investor', 'borrower']).default('investor'),
	date: column,
	period: column,
	amount: column,
	label: column
});

/**
 * Reads an uploaded CSV or xlsx file without saving anything: `inspect` returns its columns, a
 * preview and suggested columns; `read` returns every flow under a mapping, or every bad row.
 */
export const POST: RequestHandler = async (event) => {
	await requireRole(event, ...writers.deals);
	const length = Number(event.request.headers.get('content-length') ?? 0);
	if (length > MAX_UPLOAD_BYTES + 64 * 1024) {
		return json(
			{
				ok: false,
				errors: [
					{ message: 'The file is over 10 MB: split it or remove unused sheets and columns.' }
				]
			},
			{ status: 413 }
		);
	}
	const form = await event.request.formData().catch(() => null);
	if (!form) error(400, 'Send the file as multipart form data.');
	const file = form.get('file');
	if (!(file instanceof File) || file.size === 0) {
		return json(
			{ ok: false, errors: [{ message: 'Choose a file: the upload was empty.' }] },
			{ status: 400 }
		);
	}
	const options = mappingSchema.safeParse(
		Object.fromEntries(
			[...form.entries()]
				.filter(([k]) => k !== 'file')
				.map(([k, v]) => [k, v === '' ? undefined : v])
		)
	);
	if (!options.success)
		return json(
			{ ok: false, errors: [{ message: options.error.issues[0].message }] },
			{ status: 400 }
		);
	const bytes = new Uint8Array(await file.arrayBuffer());
	if (options.data.step === 'inspect') {
		const inspected = await inspectUpload(file.name, bytes);
		return json(inspected, { status: inspected.ok ? 200 : 400 });
	}
	const { mode, signConvention, date, period, amount, label } = options.data;
	if (amount === undefined)
		return json(
			{ ok: false, errors: [{ message: 'Choose which column holds the amounts.' }] },
			{ status: 400 }
		);
	const read = await readFlows(
		file.name,
		bytes,
		{ date, period, amount, label },
		{ mode, signConvention }
	);
	return json(read, { status: read.ok ? 200 : 400 });
};
