import { fail, redirect } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signInSchema } from '$lib/schemas/auth';
import { createSession, setSessionCookie } from '$lib/server/auth';
import { db } from '$lib/server/db';
import * as users from '$lib/server/users';
import type { Actions, PageServerLoad } from './$types';

import { safeNext as resolveNext } from '$lib/server/links';

const safeNext = (next: string | null, origin: string) => resolveNext(next, origin, '/cruises');

// Public by design: the door itself.
export const load: PageServerLoad = async ({ locals, url }) => {
	if (locals.user) redirect(303, safeNext(url.searchParams.get('next'), url.origin));
	return { form: await superValidate(zod4(signInSchema)) };
};

export const actions: Actions = {
	default: async (event) => {
		const form = await superValidate(event.request, zod4(signInSchema));
		const password = form.data.password;
		form.data.password = ''; // never sent back
		if (!form.valid) return fail(400, { form });
		const result = await users.signIn(form.data.email, password, event.getClientAddress());
		if (!result.ok && result.reason === 'locked') {
			const minutes = Math.ceil(result.retryAfterS / 60);
			return message(
				form,
				`Too many failed sign-ins. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}, or reset your password.`,
				{ status: 429 }
			);
		}
		if (!result.ok)
			return setError(form, 'password', 'That e-mail and password do not match an account.');
		const { token, expiresAt } = createSession(db, result.user.id);
		setSessionCookie(event.cookies, token, expiresAt, event.url.protocol === 'https:');
		redirect(303, safeNext(event.url.searchParams.get('next'), event.url.origin));
	}
};
