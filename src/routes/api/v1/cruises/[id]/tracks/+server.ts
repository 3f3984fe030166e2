import { json } from '@sveltejs/kit';
import { api, ApiError } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as tracks from '$lib/server/tracks';
import type { RequestHandler } from './$types';

/** Observed tracks of the cruise (no fixes; see …/residuals). */
export const GET: RequestHandler = api((event) => {
	const { cruise } = guards.requireCruiseRole(
		event,
		event.params.id,
		'chief_scientist',
		'participant',
		'master'
	);
	return json({ tracks: tracks.list(cruise.id) });
});

/**
 * Uploads a track: the raw file as the body. Query: `filename` (names the track, hints the
 * format), `format` (mgd77t, mgd77, csv, xyz; else detected), `flipDepths=1` to read depths that
 * are negative down. A bad file stores nothing (422 naming the row and column).
 */
export const POST: RequestHandler = api(async (event) => {
	const { user, cruise } = guards.requireCruiseRole(
		event,
		event.params.id,
		'chief_scientist',
		'participant'
	);
	const q = event.url.searchParams;
	const format = q.get('format');
	if (format && !tracks.isTrackFormat(format))
		throw new ApiError(415, 'format must be one of mgd77t, mgd77, csv, xyz.', 'unsupported_format');
	const filename = (q.get('filename') ?? '').slice(0, 200);
	const { read, sha256 } = await tracks.readUpload(event.request, {
		filename,
		format: format && tracks.isTrackFormat(format) ? format : undefined,
		flipDepths: q.get('flipDepths') === '1'
	});
	const track = tracks.create(user.id, cruise.id, {
		name: (q.get('name') || filename.replace(/\.[^.]*$/, '') || 'Track').slice(0, 120),
		read,
		sha256,
		depthsFlipped: q.get('flipDepths') === '1'
	});
	return json({ track }, { status: 201 });
});
