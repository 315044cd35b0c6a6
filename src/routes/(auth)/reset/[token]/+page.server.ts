import { fail, redirect } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { resetSchema } from '$lib/schemas/account';
import { passwordResetState, resetPassword } from '$lib/server/workspaces/accounts';
import type { Actions, PageServerLoad } from './$types';

// Public: the single-use token in the URL is the authority (allowlisted in the guard-coverage test).
export const load: PageServerLoad = async ({ params }) => ({
	state: await passwordResetState(params.token),
	form: await superValidate(zod4(resetSchema))
});

export const actions: Actions = {
	default: async ({ request, params }) => {
		const form = await superValidate(request, zod4(resetSchema));
		const password = form.data.password;
		form.data.password = '';
		form.data.confirm = '';
		if (!form.valid) return fail(400, { form });
		const outcome = await resetPassword(params.token, password);
		if (outcome !== 'done') return message(form, outcome, { status: 410 });
		redirect(303, '/signin?reset=1');
	}
};
