import { json } from '@sveltejs/kit';
import { api } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as publications from '$lib/server/publications';
import type { RequestHandler } from './$types';

/** Publishes the current timeline as the next version and mails everyone on the cruise once. */
export const POST: RequestHandler = api((event) => {
	const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
	return json(publications.publish(user.id, cruise.id));
});
