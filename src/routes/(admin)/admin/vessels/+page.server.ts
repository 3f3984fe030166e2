import * as guards from '$lib/server/guards';
import * as vessels from '$lib/server/vessels';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	guards.requireAdmin(event);
	return { vessels: vessels.list() };
};
