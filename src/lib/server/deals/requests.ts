// Reading deal content from a request (JSON field of a form, or a JSON body) into a validated DealContent.
import { dealContentSchema, type DealContent } from '../../schemas/deal';

export type ContentIssue = { path: string; message: string };

export function parseContent(
	raw: unknown
): { ok: true; content: DealContent } | { ok: false; issues: ContentIssue[] } {
	const parsed = dealContentSchema.safeParse(raw);
	if (parsed.success) return { ok: true, content: parsed.data };
	return {
		ok: false,
		issues: parsed.error.issues
			.slice(0, 200)
			.map((i) => ({ path: i.path.join('.'), message: i.message }))
	};
}

export function parseJsonField(text: FormDataEntryValue | null): unknown {
	if (typeof text !== 'string') return null;
	try {
		return JSON.parse(text);
	} catch {
		return null;
	}
}
