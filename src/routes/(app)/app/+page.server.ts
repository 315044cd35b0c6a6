import { requireUser } from '$lib/server/auth';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireUser(event);
	return { hasWorkspace: !!actor.workspace };
};
