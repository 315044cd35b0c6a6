import { error } from '@sveltejs/kit';
import { requireRole } from '$lib/server/auth';
import { getDealFile } from '$lib/server/deals';
import type { RequestHandler } from './$types';

/** The original file uploaded with a deal, byte for byte. */
export const GET: RequestHandler = async (event) => {
	const actor = await requireRole(event);
	const file = await getDealFile(actor.workspace.id, event.params.dealId, event.params.fileId);
	if (!file) error(404, 'Not found');
	return new Response(new Uint8Array(file.bytes) as BodyInit, {
		headers: {
			'content-type': file.contentType || 'application/octet-stream',
			'content-disposition': `attachment; filename="${file.fileName.replace(/["\\]/g, '')}"`
		}
	});
};
