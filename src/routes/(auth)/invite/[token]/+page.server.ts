import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { acceptInvitationSchema } from '$lib/schemas/auth';
import { createSession, setSessionCookie } from '$lib/server/auth';
import { db } from '$lib/server/db';
import * as users from '$lib/server/users';
import type { Actions, PageServerLoad } from './$types';

// Public by design: the single-use token in the link is the credential.
// The answer is the same whether or not the address has an account (nothing here reveals it).
export const load: PageServerLoad = async ({ params, locals }) => {
	const found = users.invitationByToken(params.token);
	return {
		problem: found.ok ? null : found.message,
		email: found.ok ? found.invitation.email : null,
		signedInAs: locals.user?.email ?? null,
		form: await superValidate(zod4(acceptInvitationSchema))
	};
};

export const actions: Actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(acceptInvitationSchema));
		const password = form.data.password;
		// never send a password back to the browser
		form.data.password = '';
		form.data.confirm = '';
		if (!form.valid) return fail(400, { form });
		let client = 'unknown';
		try {
			client = event.getClientAddress();
		} catch {
			// no address header (a direct local request behind ADDRESS_HEADER): one shared bucket
		}
		let userId: string;
		try {
			userId = (
				await users.acceptInvitation(
					event.params.token,
					form.data.name,
					password,
					event.locals.user?.id ?? null,
					client
				)
			).id;
		} catch (e) {
			if (e instanceof users.DomainError)
				return setError(form, e.field === 'password' ? 'password' : 'name', e.message, {
					status: e.status === 429 ? 429 : 400
				});
			throw e;
		}
		const { token, expiresAt } = createSession(db, userId);
		setSessionCookie(event.cookies, token, expiresAt, event.url.protocol === 'https:');
		redirect(303, '/cruises');
	}
};
