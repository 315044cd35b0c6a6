import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { forgotSchema } from '$lib/schemas/account';
import { attemptAllowed, recordAttempt, retryMessage } from '$lib/server/auth';
import { sendMail } from '$lib/server/mail';
import { passwordResetMail } from '$lib/server/mail/templates';
import { createPasswordReset } from '$lib/server/workspaces/accounts';
import type { Actions, PageServerLoad } from './$types';

// Public: a forgotten password is asked for signed out (allowlisted in the guard-coverage test).
export const load: PageServerLoad = async () => ({ form: await superValidate(zod4(forgotSchema)) });

export const actions: Actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(forgotSchema));
		if (!form.valid) return fail(400, { form });
		const ip = event.getClientAddress();
		const limit = await attemptAllowed('reset', form.data.email, ip);
		if (!limit.allowed) return message(form, retryMessage(limit.retryAt), { status: 429 });
		await recordAttempt('reset', form.data.email, ip, true);
		const token = await createPasswordReset(form.data.email);
		if (token) {
			await sendMail(passwordResetMail(form.data.email, `${event.url.origin}/reset/${token}`));
		}
		// The same answer whether or not the address has an account.
		return message(form, 'sent');
	}
};
