import { api } from '$lib/server/api';
import * as exportFiles from '$lib/server/exports';
import * as guards from '$lib/server/guards';
import type { RequestHandler } from './$types';

// The first export URLs, kept working: rtz, gpx and csv give the route; geojson and kml the layers.
export const GET: RequestHandler = api(async (event) => {
	const { cruise } = guards.requireCruiseRole(event, event.params.id);
	return exportFiles.response(await exportFiles.legacy(cruise.id, event.params.format));
});
