import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { resetRequestSchema } from '$lib/schemas/auth';
import * as users from '$lib/server/users';
import type { Actions, PageServerLoad } from './$types';

// Public by design: anyone may ask for a reset link; the answer never tells whether an account exists.
export const load: PageServerLoad = async () => {
	return { form: await superValidate(zod4(resetRequestSchema)) };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(resetRequestSchema));
		if (!form.valid) return fail(400, { form });
		let client = 'unknown';
		try {
			client = event.getClientAddress();
		} catch {
			// no address header (e.g. a direct local request behind ADDRESS_HEADER): one shared bucket
		}
		try {
			await users.requestPasswordReset(form.data.email, client);
		} catch (e) {
			if (e instanceof users.RateLimited) return message(form, e.message, { status: 429 });
			throw e;
		}
		return message(form, {
			type: 'ok',
			text: `If ${form.data.email} has an account, a reset link is on its way. It works once, for ${users.RESET_LIFETIME_MINUTES} minutes.`
		});
	}
};
