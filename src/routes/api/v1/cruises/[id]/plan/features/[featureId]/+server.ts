import { json } from '@sveltejs/kit';
import { api, readJson } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as plan from '$lib/server/plan';
import { featurePatchSchema } from '$lib/schemas/plan';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api(async (event) => {
	const { cruise } = guards.requireCruiseRole(event, event.params.id);
	return json(await plan.feature(cruise.id, event.params.featureId));
});

export const PATCH: RequestHandler = api(async (event) => {
	const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
	const patch = await readJson(event, featurePatchSchema);
	const updated = await plan.update(user.id, cruise.id, event.params.featureId, patch);
	return json({ ...updated, fit: await plan.fit(cruise.id) });
});

export const DELETE: RequestHandler = api((event) => {
	const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
	plan.remove(user.id, cruise.id, event.params.featureId);
	return new Response(null, { status: 204 });
});
