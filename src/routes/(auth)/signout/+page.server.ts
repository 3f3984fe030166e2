import { redirect } from '@sveltejs/kit';
import { deleteSessionCookie, invalidateAllSessions, invalidateSession } from '$lib/server/auth';
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
	everywhere: (event) => {
		const user = guards.requireUser(event);
		invalidateAllSessions(db, user.id);
		deleteSessionCookie(event.cookies, event.url.protocol === 'https:');
		redirect(303, '/signin?signedOut=all');
	}
};
