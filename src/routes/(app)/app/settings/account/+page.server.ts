import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { changePasswordSchema } from '$lib/schemas/account';
import { requireUser } from '$lib/server/auth';
import { changePassword } from '$lib/server/workspaces/accounts';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	await requireUser(event);
	return { form: await superValidate(zod4(changePasswordSchema)) };
};

export const actions: Actions = {
	password: async (event) => {
		const actor = await requireUser(event);
		const form = await superValidate(event.request, zod4(changePasswordSchema));
		const { current, password } = form.data;
		form.data = { current: '', password: '', confirm: '' };
		if (!form.valid) return fail(400, { form });
		if (!(await changePassword(actor.user.id, current, password))) {
			return setError(form, 'current', 'That is not your current password.');
		}
		return message(form, 'Password changed.');
	}
};
