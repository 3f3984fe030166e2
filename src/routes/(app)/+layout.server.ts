import * as guards from '$lib/server/guards';
import type { LayoutServerLoad } from './$types';

// Identity for the shell only; every page and action below checks its own authority too.
export const load: LayoutServerLoad = (event) => {
	const user = guards.requireUser(event);
	return { user };
};
