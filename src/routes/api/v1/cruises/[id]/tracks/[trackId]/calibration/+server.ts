import { json } from '@sveltejs/kit';
import { api, ApiError, readJson } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as tracks from '$lib/server/tracks';
import { calibrationSchema } from '$lib/schemas/tracks';
import type { RequestHandler } from './$types';

/** What fitting a segment to this track would give: `?segmentId=…&fitRate=1&nearAxisKm=15`. */
export const GET: RequestHandler = api((event) => {
	const { cruise } = guards.requireCruiseRole(
		event,
		event.params.id,
		'chief_scientist',
		'participant',
		'master'
	);
	const q = event.url.searchParams;
	const parsed = calibrationSchema.safeParse({
		segmentId: q.get('segmentId') ?? '',
		fitRate: q.get('fitRate') === '1',
		nearAxisKm: q.has('nearAxisKm') ? Number(q.get('nearAxisKm')) : undefined
	});
	if (!parsed.success)
		throw new ApiError(422, parsed.error.issues.map((i) => i.message).join('; '), 'invalid');
	return json({ calibration: tracks.calibration(cruise.id, event.params.trackId, parsed.data) });
});

/** Applies the fit to the ridge segment (chief scientist; audit-logged); the plan follows. */
export const POST: RequestHandler = api(async (event) => {
	const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
	const body = await readJson(event, calibrationSchema);
	return json({
		calibration: await tracks.applyCalibration(user.id, cruise.id, event.params.trackId, body)
	});
});
