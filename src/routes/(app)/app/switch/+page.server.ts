import { error, redirect } from '@sveltejs/kit';
import { switchWorkspaceSchema } from '$lib/schemas/account';
import { requireUser, WORKSPACE_COOKIE } from '$lib/server/auth';
import { parseSmallForm } from '$lib/server/forms';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireUser(event);
	redirect(303, '/app');
};

export const actions: Actions = {
	default: async (event) => {
		const actor = await requireUser(event);
		const { workspaceId } = await parseSmallForm(event.request, switchWorkspaceSchema);
		// Only a workspace the user belongs to can be chosen; anything else is "not found".
		if (!actor.workspaces.some((w) => w.id === workspaceId)) error(404, 'Not found');
		event.cookies.set(WORKSPACE_COOKIE, workspaceId, {
			path: '/',
			httpOnly: true,
			sameSite: 'lax',
			maxAge: 60 * 60 * 24 * 365
		});
		redirect(303, '/app');
	}
};
