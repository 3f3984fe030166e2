import { FORMATS } from '$lib/engine/formats';
import * as guards from '$lib/server/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	return {
		formats: FORMATS,
		canImport: access.isAdmin || access.role === 'chief_scientist'
	};
};
