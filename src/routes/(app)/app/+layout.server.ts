import { requireUser } from '$lib/server/auth';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const actor = await requireUser(event);
	return {
		user: actor.user,
		workspaces: actor.workspaces.map(({ id, name, role }) => ({ id, name, role })),
		workspace: actor.workspace && {
			id: actor.workspace.id,
			name: actor.workspace.name,
			role: actor.workspace.role
		}
	};
};
