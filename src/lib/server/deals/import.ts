import { z } from 'zod';
import { dealContentSchema, type DealContent } from '../../schemas/deal';
import { readFlows } from './upload';
import type { UploadedFile } from './index';

const column = z.preprocess(
	(v) => (v === '' || v === null ? undefined : v),
	z.coerce.number().int().min(0).max(10_000).optional()
);
const importSchema = z.object({
	mode: z.enum(['dated', 'periodic']).default('dated'),
	signConvention: z.enum(['investor', 'borrower']).default('investor'),
	date: column,
	period: column,
	amount: column,
	label: column
});

/**
 * The confirmed upload: reads the file again under the chosen mapping and returns content to save
 * with the original file, or the problems (row, column, reason). Settings other than the flows
 * come from `base` (the deal's current content) or the defaults.
 */
export async function contentFromUpload(form: FormData, base: Partial<DealContent> = {}) {
	const file = form.get('file');
	if (!(file instanceof File) || file.size === 0)
		return { ok: false as const, problems: [{ message: 'Choose a file: the upload was empty.' }] };
	const options = importSchema.safeParse(
		Object.fromEntries([...form.entries()].filter(([k]) => k !== 'file'))
	);
	if (!options.success || options.data.amount === undefined) {
		return {
			ok: false as const,
			problems: [{ message: 'Choose which column holds the amounts.' }]
		};
	}
	const bytes = new Uint8Array(await file.arrayBuffer());
	const { mode, signConvention, date, period, amount, label } = options.data;
	const read = await readFlows(
		file.name,
		bytes,
		{ date, period, amount, label },
		{ mode, signConvention }
	);
	if (!read.ok) return { ok: false as const, problems: read.errors };
	const content = dealContentSchema.parse({
		...base,
		mode,
		signConvention: 'investor',
		flows: read.flows.map((f) => ({
			date: f.date,
			period: f.period,
			amount: f.amount,
			label: f.label
		}))
	});
	const uploaded: UploadedFile = {
		fileName: file.name,
		contentType: file.type || 'application/octet-stream',
		bytes
	};
	return { ok: true as const, content, file: uploaded };
}
