import { json } from '@sveltejs/kit';
import { api, ApiError } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as tracks from '$lib/server/tracks';
import type { RequestHandler } from './$types';

/**
 * Observed − predicted depth per fix, statistics and what the mean residual implies. Query
 * `maxPoints` (default 5000, at most 200 000) thins the returned points; statistics use every fix.
 */
export const GET: RequestHandler = api((event) => {
	const { cruise } = guards.requireCruiseRole(
		event,
		event.params.id,
		'chief_scientist',
		'participant',
		'master'
	);
	const raw = event.url.searchParams.get('maxPoints');
	const maxPoints = raw === null ? tracks.DEFAULT_RESIDUAL_POINTS : Number(raw);
	if (!(Number.isInteger(maxPoints) && maxPoints >= 2 && maxPoints <= tracks.MAX_RESIDUAL_POINTS))
		throw new ApiError(
			400,
			`maxPoints must be a whole number from 2 to ${tracks.MAX_RESIDUAL_POINTS}.`,
			'invalid'
		);
	return json(tracks.residuals(cruise.id, event.params.trackId, maxPoints));
});
