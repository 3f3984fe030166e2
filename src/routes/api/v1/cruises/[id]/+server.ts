import { json } from '@sveltejs/kit';
import { api, ApiError } from '$lib/server/api';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api((event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const d = cruises.detail(access.cruise.id);
	if (!d) throw new ApiError(404, 'No such cruise.');
	return json(cruises.toApi(d, access.role));
});
