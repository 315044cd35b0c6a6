import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signInLinkSchema, signInSchema } from '$lib/schemas/account';
import {
	attemptAllowed,
	auditFailedSignIn,
	getActor,
	recordAttempt,
	retryMessage,
	safeNext,
	sendSignInLink,
	startPasswordSession
} from '$lib/server/auth';
import type { Actions, PageServerLoad } from './$types';

// Public: signing in is how a visitor becomes a user (allowlisted in the guard-coverage test).
export const load: PageServerLoad = async (event) => {
	if (await getActor(event)) redirect(303, safeNext(event.url));
	return {
		passwordForm: await superValidate(zod4(signInSchema), { id: 'password' }),
		linkForm: await superValidate(zod4(signInLinkSchema), { id: 'link' })
	};
};

export const actions: Actions = {
	password: async (event) => {
		const form = await superValidate(event.request, zod4(signInSchema), { id: 'password' });
		const password = form.data.password;
		form.data.password = ''; // never echo a password back
		if (!form.valid) return fail(400, { form });
		const { email } = form.data;
		const ip = event.getClientAddress();
		const limit = await attemptAllowed('password', email, ip);
		if (!limit.allowed) return message(form, retryMessage(limit.retryAt), { status: 429 });
		const ok = await startPasswordSession(event, email, password);
		await recordAttempt('password', email, ip, ok);
		if (!ok) {
			await auditFailedSignIn(email, ip, 'wrong e-mail or password');
			// The same answer for an unknown e-mail and a wrong password.
			return message(form, 'That e-mail and password do not match an account.', { status: 400 });
		}
		redirect(303, safeNext(event.url));
	},
	link: async (event) => {
		const form = await superValidate(event.request, zod4(signInLinkSchema), { id: 'link' });
		if (!form.valid) return fail(400, { form });
		const ip = event.getClientAddress();
		const limit = await attemptAllowed('link', form.data.email, ip);
		if (!limit.allowed) return message(form, retryMessage(limit.retryAt), { status: 429 });
		await recordAttempt('link', form.data.email, ip, true);
		await sendSignInLink(event, form.data.email, safeNext(event.url));
		redirect(303, '/signin/check-email');
	}
};
