import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signUpSchema } from '$lib/schemas/account';
import { getActor, startPasswordSession } from '$lib/server/auth';
import { billingPath, startCheckout } from '$lib/server/billing';
import { toCheckout } from '$lib/server/billing/leave';
import { signUp } from '$lib/server/workspaces/accounts';
import type { Actions, PageServerLoad } from './$types';

// Public: sign-up creates the account and its workspace (allowlisted in the guard-coverage test).
export const load: PageServerLoad = async (event) => {
	if (await getActor(event)) redirect(303, '/app');
	return { form: await superValidate(zod4(signUpSchema)) };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(signUpSchema));
		const password = form.data.password;
		form.data.password = '';
		if (!form.valid) return fail(400, { form });
		const created = await signUp({ ...form.data, password });
		if (!created.ok) return setError(form, created.field, created.message);
		await startPasswordSession(event, form.data.email, password);
		// The new workspace runs on its trial until Stripe confirms the payment started here.
		const checkout = await startCheckout(
			{ workspaceId: created.workspaceId, actorId: created.userId, email: form.data.email },
			form.data.seats,
			event.url.origin
		);
		if (!checkout.ok) {
			console.error(`[pincer] request ${event.locals.requestId}: ${checkout.message}`);
			redirect(303, `${billingPath}?checkout=unavailable`);
		}
		toCheckout(event, checkout);
	}
};
