import { error } from '@sveltejs/kit';
import type { z } from 'zod';

/** Parses a small form (ids and choices, no user-typed text worth keeping) or answers 400 naming the problem. */
export async function parseSmallForm<S extends z.ZodType>(
	request: Request,
	schema: S
): Promise<z.output<S>> {
	const parsed = schema.safeParse(Object.fromEntries(await request.formData()));
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		error(400, `${issue.path.join('.') || 'form'}: ${issue.message}`);
	}
	return parsed.data;
}
