import { json } from '@sveltejs/kit';
import { api, readJson } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as plan from '$lib/server/plan';
import { newFeatureSchema } from '$lib/schemas/plan';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = api(async (event) => {
	const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
	const input = await readJson(event, newFeatureSchema);
	// `fit` (RFC 7946 foreign member): the plan against its allocation after this change.
	const created = await plan.create(user.id, cruise.id, input);
	return json({ ...created, fit: await plan.fit(cruise.id) }, { status: 201 });
});
