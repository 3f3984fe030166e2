import { ROUTE_FORMATS } from '$lib/engine/formats/route';
import * as guards from '$lib/server/guards';
import { LAYER_FORMATS } from '$lib/server/exports';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	return {
		routeFormats: ROUTE_FORMATS,
		layerFormats: LAYER_FORMATS,
		canImport: access.isAdmin || access.role === 'chief_scientist'
	};
};
