import { error, fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { apiKeyCreateSchema, apiKeyIdSchema } from '$lib/schemas/api';
import { createApiKey, listApiKeys, revokeApiKey } from '$lib/server/api/keys';
import { requireRole } from '$lib/server/auth';
import { parseSmallForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

/** What the page shows once, right after creation: the key in clear. */
export type CreatedKey = { name: string; key: string };

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event, 'admin');
	const [keys, form] = await Promise.all([
		listApiKeys(actor.workspace.id),
		superValidate(zod4(apiKeyCreateSchema), { id: 'create-key' })
	]);
	return { keys, form };
};

export const actions: Actions = {
	create: async (event) => {
		const actor = await requireRole(event, 'admin');
		const form = await superValidate(event.request, zod4(apiKeyCreateSchema), { id: 'create-key' });
		if (!form.valid) return fail(400, { form });
		const made = await createApiKey(
			{ workspaceId: actor.workspace.id, actorId: actor.user.id },
			form.data
		);
		return message(form, { name: form.data.name, key: made.key } satisfies CreatedKey);
	},
	revoke: async (event) => {
		const actor = await requireRole(event, 'admin');
		const { keyId } = await parseSmallForm(event.request, apiKeyIdSchema);
		const done = await revokeApiKey(
			{ workspaceId: actor.workspace.id, actorId: actor.user.id },
			keyId
		);
		if (!done) error(404, 'Not found');
		return { notice: 'Key revoked: calls with it are now refused.' };
	}
};
