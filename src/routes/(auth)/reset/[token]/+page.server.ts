import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { resetPasswordSchema } from '$lib/schemas/auth';
import * as users from '$lib/server/users';
import type { Actions, PageServerLoad } from './$types';

// Public by design: the single-use token in the link is the credential.
export const load: PageServerLoad = async ({ params }) => {
	const found = users.resetByToken(params.token);
	return {
		problem: found.ok ? null : found.message,
		// The holder of the link may also revoke the account's API tokens; they see which.
		tokens: found.ok ? users.liveTokens(found.reset.userId) : [],
		form: await superValidate(zod4(resetPasswordSchema))
	};
};

export const actions: Actions = {
	default: async ({ request, params }) => {
		const form = await superValidate(request, zod4(resetPasswordSchema));
		const password = form.data.password;
		form.data.password = ''; // never sent back
		form.data.confirm = '';
		if (!form.valid) return fail(400, { form });
		try {
			await users.resetPassword(params.token, password, { revokeTokens: form.data.revokeTokens });
		} catch (e) {
			if (e instanceof users.DomainError) return setError(form, 'password', e.message);
			throw e;
		}
		redirect(303, '/signin?reset=done');
	}
};
