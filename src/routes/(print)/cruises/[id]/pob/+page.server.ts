import * as guards from '$lib/server/guards';
import * as pob from '$lib/server/pob';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const { cruise } = guards.requireHeldCruiseRole(event, event.params.id, 'master', 'port_agent');
	return {
		cruise: { id: cruise.id, code: cruise.code, title: cruise.title },
		legs: pob.list(cruise.id),
		printedAt: new Date().toISOString().slice(0, 16).replace('T', ' ') + ' UTC'
	};
};
