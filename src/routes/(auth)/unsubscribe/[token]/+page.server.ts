import { fail } from '@sveltejs/kit';
import { ApiError } from '$lib/server/api';
import * as notices from '$lib/server/notices';
import type { Actions, PageServerLoad } from './$types';

// Public by design: the single-use token in the link is the credential, and RFC 8058 one-click
// unsubscribe must work without signing in. Opening the link (GET) changes nothing, since mail
// scanners fetch links; only the POST (the button, or the mail client's one-click) does.
export const load: PageServerLoad = ({ params }) => {
	return { view: notices.peekUnsubscribe(params.token) };
};

export const actions: Actions = {
	default: ({ params }) => {
		try {
			const done = notices.unsubscribe(params.token);
			return { done };
		} catch (e) {
			if (e instanceof ApiError) return fail(e.status, { problem: e.message });
			throw e;
		}
	}
};
