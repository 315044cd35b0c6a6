import { error, fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { acceptInvitationSchema } from '$lib/schemas/account';
import { getActor, requireUser, startPasswordSession, WORKSPACE_COOKIE } from '$lib/server/auth';
import { acceptInvitation, findInvitation, stateMessage } from '$lib/server/workspaces/invitations';
import type { Actions, PageServerLoad } from './$types';

// Public: the single-use invitation token is the authority (allowlisted in the guard-coverage test).
export const load: PageServerLoad = async (event) => {
	const [found, actor] = await Promise.all([findInvitation(event.params.token), getActor(event)]);
	const invitation = found.invitation && {
		email: found.invitation.email,
		role: found.invitation.role,
		workspaceName: found.invitation.workspaceName,
		invitedBy: found.invitation.invitedBy,
		hasAccount: found.invitation.hasAccount
	};
	return {
		state: found.state,
		problem: stateMessage(found.state),
		invitation,
		signedInAs: actor?.user.email ?? null,
		form: await superValidate(zod4(acceptInvitationSchema))
	};
};

const cookieOptions = {
	path: '/',
	httpOnly: true,
	sameSite: 'lax' as const,
	maxAge: 60 * 60 * 24 * 365
};

export const actions: Actions = {
	/** A signed-in user whose e-mail matches accepts with one click. */
	accept: async (event) => {
		const actor = await requireUser(event);
		const outcome = await acceptInvitation(event.params.token, {
			kind: 'existing',
			userId: actor.user.id,
			email: actor.user.email
		});
		if (!outcome.ok) error(outcome.reason === 'seats' ? 409 : 410, outcome.message);
		event.cookies.set(WORKSPACE_COOKIE, outcome.workspaceId, cookieOptions);
		redirect(303, '/app?joined=1');
	},
	/** Someone new names themselves, chooses a password, and joins. */
	create: async (event) => {
		const form = await superValidate(event.request, zod4(acceptInvitationSchema));
		const password = form.data.password;
		form.data.password = '';
		form.data.confirm = '';
		if (!form.valid) return fail(400, { form });
		const outcome = await acceptInvitation(event.params.token, {
			kind: 'new',
			name: form.data.name,
			password
		});
		if (!outcome.ok)
			return message(form, outcome.message, { status: outcome.reason === 'seats' ? 409 : 410 });
		const found = await findInvitation(event.params.token);
		await startPasswordSession(event, found.invitation?.email ?? '', password);
		event.cookies.set(WORKSPACE_COOKIE, outcome.workspaceId, cookieOptions);
		redirect(303, '/app?joined=1');
	}
};
