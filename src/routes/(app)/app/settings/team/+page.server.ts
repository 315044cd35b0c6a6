import { error, fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import {
	invitationIdSchema,
	inviteSchema,
	memberRoleSchema,
	memberSchema
} from '$lib/schemas/account';
import { requireRole } from '$lib/server/auth';
import { parseSmallForm } from '$lib/server/forms';
import { sendMail } from '$lib/server/mail';
import { invitationMail } from '$lib/server/mail/templates';
import * as team from '$lib/server/workspaces/members';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event, 'admin');
	const [members, invitations] = await Promise.all([
		team.listMembers(actor.workspace.id),
		team.listPendingInvitations(actor.workspace.id)
	]);
	return {
		members,
		invitations,
		seats: actor.workspace.seats,
		me: actor.user.id,
		form: await superValidate(zod4(inviteSchema), { id: 'invite' })
	};
};

const mailDown =
	'The invitation e-mail could not be sent, so nothing was saved. Try again in a moment.';

export const actions: Actions = {
	invite: async (event) => {
		const actor = await requireRole(event, 'admin');
		const form = await superValidate(event.request, zod4(inviteSchema), { id: 'invite' });
		if (!form.valid) return fail(400, { form });
		const acting = { workspaceId: actor.workspace.id, actorId: actor.user.id };
		const invitedBy = actor.user.name ?? actor.user.email;
		const created = await team
			.invite(acting, form.data, (token, workspace) =>
				sendMail(
					invitationMail(form.data.email, `${event.url.origin}/invite/${token}`, {
						workspace,
						role: form.data.role,
						invitedBy
					})
				)
			)
			.catch((err: Error) => {
				console.error(`[pincer] request ${event.locals.requestId}: invitation mail failed`, err);
				return { ok: false as const, message: mailDown };
			});
		if (!created.ok) return setError(form, 'email', created.message, { status: 409 });
		return message(form, `Invitation sent to ${form.data.email}.`);
	},
	resend: async (event) => {
		const actor = await requireRole(event, 'admin');
		const { invitationId } = await parseSmallForm(event.request, invitationIdSchema);
		const acting = { workspaceId: actor.workspace.id, actorId: actor.user.id };
		const renewed = await team.resendInvitation(acting, invitationId, (token, email, role) =>
			sendMail(
				invitationMail(email, `${event.url.origin}/invite/${token}`, {
					workspace: actor.workspace.name,
					role,
					invitedBy: actor.user.name ?? actor.user.email
				})
			)
		);
		if (!renewed) error(404, 'Not found');
		return {
			notice: `Invitation sent again to ${renewed.email}; the earlier link no longer works.`
		};
	},
	revoke: async (event) => {
		const actor = await requireRole(event, 'admin');
		const { invitationId } = await parseSmallForm(event.request, invitationIdSchema);
		const done = await team.revokeInvitation(
			{ workspaceId: actor.workspace.id, actorId: actor.user.id },
			invitationId
		);
		if (!done) error(404, 'Not found');
		return { notice: 'Invitation withdrawn.' };
	},
	role: async (event) => {
		const actor = await requireRole(event, 'admin');
		const { membershipId, role } = await parseSmallForm(event.request, memberRoleSchema);
		const outcome = await team.changeRole(
			{ workspaceId: actor.workspace.id, actorId: actor.user.id },
			membershipId,
			role
		);
		if (!outcome) error(404, 'Not found');
		if (!outcome.ok) return fail(409, { problem: outcome.message });
		return { notice: 'Role changed.' };
	},
	remove: async (event) => {
		const actor = await requireRole(event, 'admin');
		const { membershipId } = await parseSmallForm(event.request, memberSchema);
		const outcome = await team.removeMember(
			{ workspaceId: actor.workspace.id, actorId: actor.user.id },
			membershipId
		);
		if (!outcome) error(404, 'Not found');
		if (!outcome.ok) return fail(409, { problem: outcome.message });
		return { notice: 'Member removed.' };
	}
};
