import { redirect } from '@sveltejs/kit';
import { auditForUser, endSession, getActor } from '$lib/server/auth';
import { db } from '$lib/server/db';
import type { Actions, PageServerLoad } from './$types';

// Public: signing out needs no role; a visitor who is not signed in is simply sent home.
export const load: PageServerLoad = async () => redirect(303, '/');

export const actions: Actions = {
	default: async (event) => {
		const actor = await getActor(event);
		if (actor) await db.transaction((tx) => auditForUser(tx, actor.user.id, 'auth.signout'));
		await endSession(event);
		event.cookies.delete('pincer_workspace', { path: '/' });
		redirect(303, '/signin?signedout=1');
	}
};
