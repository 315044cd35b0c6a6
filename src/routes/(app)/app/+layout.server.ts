import { requireUser } from '$lib/server/auth';
import { readOnlyMessage, readOnlyReason } from '$lib/server/billing';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = async (event) => {
	const actor = await requireUser(event);
	return {
		user: actor.user,
		workspaces: actor.workspaces.map(({ id, name, role }) => ({ id, name, role })),
		workspace: actor.workspace && {
			id: actor.workspace.id,
			name: actor.workspace.name,
			role: actor.workspace.role,
			subscriptionStatus: actor.workspace.subscriptionStatus
		},
		readOnly: readOnlyNotice(actor.workspace)
	};
};

function readOnlyNotice(workspace: Parameters<typeof readOnlyReason>[0] | null) {
	const reason = workspace && readOnlyReason(workspace);
	return reason && workspace ? readOnlyMessage(workspace, reason) : null;
}
