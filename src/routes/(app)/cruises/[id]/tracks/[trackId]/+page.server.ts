import { error } from '@sveltejs/kit';
import { ApiError } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as tracks from '$lib/server/tracks';
import type { PageServerLoad } from './$types';

/** Points drawn on the page (every fix counts in the statistics). */
const PAGE_POINTS = 3000;

export const load: PageServerLoad = (event) => {
	const access = guards.requireCruiseRole(
		event,
		event.params.id,
		'chief_scientist',
		'participant',
		'master'
	);
	let result: tracks.ResidualsAnswer;
	try {
		result = tracks.residuals(access.cruise.id, event.params.trackId, PAGE_POINTS);
	} catch (e) {
		if (e instanceof ApiError) error(e.status, e.message);
		throw e;
	}
	return {
		result,
		canCalibrate: access.isAdmin || access.role === 'chief_scientist'
	};
};
