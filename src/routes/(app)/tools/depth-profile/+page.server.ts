import * as guards from '$lib/server/guards';
import type { PageServerLoad } from './$types';

// The page computes through POST /api/v1/depth-profile, which checks the caller again.
export const load: PageServerLoad = (event) => {
	guards.requireUser(event);
	return {};
};
