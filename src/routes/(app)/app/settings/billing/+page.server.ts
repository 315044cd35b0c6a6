import { fail, redirect } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { seatsSchema } from '$lib/schemas/billing';
import { requireRole } from '$lib/server/auth';
import { billingOverview, changeSeats, openPortal, startCheckout } from '$lib/server/billing';
import { postedByScript, toCheckout } from '$lib/server/billing/leave';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const actor = await requireRole(event, 'admin');
	const query = event.url.searchParams;
	const overview = await billingOverview(actor.workspace.id, {
		checkout: query.get('checkout'),
		sessionId: query.get('session_id'),
		pay: query.get('pay')
	});
	const [subscribeForm, seatsForm] = await Promise.all([
		superValidate({ seats: Math.max(overview.inUse, overview.seats) }, zod4(seatsSchema), {
			id: 'subscribe',
			errors: false
		}),
		superValidate({ seats: overview.stripeSeats ?? overview.seats }, zod4(seatsSchema), {
			id: 'seats',
			errors: false
		})
	]);
	return { ...overview, subscribeForm, seatsForm };
};

export const actions: Actions = {
	subscribe: async (event) => {
		const actor = await requireRole(event, 'admin');
		const form = await superValidate(event.request, zod4(seatsSchema), { id: 'subscribe' });
		if (!form.valid) return fail(400, { form });
		const acting = { workspaceId: actor.workspace.id, actorId: actor.user.id };
		const checkout = await startCheckout(
			{ ...acting, email: actor.user.email },
			form.data.seats,
			event.url.origin
		);
		if (!checkout.ok) return setError(form, 'seats', checkout.message, { status: 409 });
		toCheckout(event, checkout);
	},
	seats: async (event) => {
		const actor = await requireRole(event, 'admin');
		const form = await superValidate(event.request, zod4(seatsSchema), { id: 'seats' });
		if (!form.valid) return fail(400, { form });
		const acting = { workspaceId: actor.workspace.id, actorId: actor.user.id };
		const changed = await changeSeats(acting, form.data.seats);
		if (!changed.ok) return setError(form, 'seats', changed.message, { status: 409 });
		if (changed.unchanged)
			return message(form, `The workspace already pays for ${changed.seats} seats.`);
		return message(
			form,
			`Stripe now bills ${changed.seats} seats; the count below changes as soon as Stripe confirms it.`
		);
	},
	portal: async (event) => {
		const actor = await requireRole(event, 'admin');
		const portal = await openPortal(actor.workspace.id, event.url.origin);
		if (!portal.ok) return fail(409, { problem: portal.message });
		if (postedByScript(event)) redirect(303, portal.url);
		return { continueTo: portal.url };
	}
};
