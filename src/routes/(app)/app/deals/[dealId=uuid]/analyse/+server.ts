import { error, json } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth';
import { analyseDeal } from '$lib/server/deals/analysis';
import { parseContent } from '$lib/server/deals/requests';
import type { RequestHandler } from './$types';

/** Live preview for the deal page: analyses the flows being edited without saving anything. */
export const POST: RequestHandler = async (event) => {
	await requireRole(event);
	if (!event.request.headers.get('content-type')?.includes('application/json'))
		error(415, 'Send JSON.');
	const body = await event.request.json().catch(() => null);
	const parsed = parseContent(body);
	if (!parsed.ok) return json({ issues: parsed.issues }, { status: 400 });
	return json({ analysis: analyseDeal(parsed.content) });
};
