import * as guards from '$lib/server/guards';
import * as tracks from '$lib/server/tracks';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const access = guards.requireCruiseRole(
		event,
		event.params.id,
		'chief_scientist',
		'participant',
		'master'
	);
	return {
		tracks: tracks.list(access.cruise.id),
		canUpload: access.isAdmin || access.role === 'chief_scientist' || access.role === 'participant',
		canDeleteAny: access.isAdmin || access.role === 'chief_scientist',
		userId: access.user.id,
		ownTracks: tracks.ownedBy(access.cruise.id, access.user.id)
	};
};
