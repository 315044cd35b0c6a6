import { requireUser } from '$lib/server/auth';
import { recentSolves } from '$lib/server/desk';
import { openAlerts } from '$lib/server/loans/checks';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireUser(event);
	if (!actor.workspace) return { hasWorkspace: false, alerts: [], recent: [] };
	const [alerts, recent] = await Promise.all([
		openAlerts(actor.workspace.id),
		recentSolves(actor.workspace.id)
	]);
	return { hasWorkspace: true, alerts, recent };
};
