import { json } from '@sveltejs/kit';
import { api } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as publications from '$lib/server/publications';
import type { RequestHandler } from './$types';

/** The published versions of the schedule, newest first, with their times. */
export const GET: RequestHandler = api((event) => {
	const { cruise } = guards.requireCruiseRole(event, event.params.id);
	return json({ versions: publications.versions(cruise.id) });
});
