import { json } from '@sveltejs/kit';
import { api, ApiError } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as timelines from '$lib/server/timeline';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api(async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const { data, timeline } = await timelines.buildOffLoop(access.cruise.id);
	if (!timeline)
		throw new ApiError(
			409,
			`The cruise needs ${data.missing.join(', ')} before it has a timeline.`,
			'incomplete'
		);
	return json(timelines.toApi(timeline));
});
