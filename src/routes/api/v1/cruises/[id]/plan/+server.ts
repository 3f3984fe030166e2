import { api } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as plan from '$lib/server/plan';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api(async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const canEdit = access.isAdmin || access.role === 'chief_scientist';
	return new Response(await plan.collectionJson(access.cruise.id, canEdit), {
		headers: { 'content-type': 'application/geo+json' }
	});
});
