import { redirect } from '@sveltejs/kit';
import { superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { signOutEverywhereSchema } from '$lib/schemas/auth';
import {
	deleteSessionCookie,
	invalidateAllSessions,
	invalidateSession,
	revokeAllApiTokens
} from '$lib/server/auth';
import { db } from '$lib/server/db';
import * as guards from '$lib/server/guards';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	guards.requireUser(event);
	redirect(303, '/account');
};

export const actions: Actions = {
	here: (event) => {
		guards.requireUser(event);
		if (event.locals.session?.via === 'cookie') invalidateSession(db, event.locals.session.id);
		deleteSessionCookie(event.cookies, event.url.protocol === 'https:');
		redirect(303, '/signin');
	},
	everywhere: async (event) => {
		const user = guards.requireUser(event);
		const form = await superValidate(event.request, zod4(signOutEverywhereSchema));
		invalidateAllSessions(db, user.id);
		if (form.valid && form.data.revokeTokens) revokeAllApiTokens(db, user.id);
		deleteSessionCookie(event.cookies, event.url.protocol === 'https:');
		redirect(303, '/signin?signedOut=all');
	}
};
