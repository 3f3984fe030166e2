import { json } from '@sveltejs/kit';
import { api } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as tracks from '$lib/server/tracks';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api((event) => {
	const { cruise } = guards.requireCruiseRole(
		event,
		event.params.id,
		'chief_scientist',
		'participant',
		'master'
	);
	const { fixes: _fixes, ...track } = tracks.get(cruise.id, event.params.trackId);
	return json({ track });
});

/** The chief scientist deletes any track; a participant the tracks they uploaded. */
export const DELETE: RequestHandler = api((event) => {
	const access = guards.requireCruiseRole(event, event.params.id, 'chief_scientist', 'participant');
	tracks.removeAs(access, event.params.trackId);
	return new Response(null, { status: 204 });
});
