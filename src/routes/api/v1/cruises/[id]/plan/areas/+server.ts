import { json } from '@sveltejs/kit';
import { api, readJson } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as plan from '$lib/server/plan';
import { areaWithLinesSchema } from '$lib/schemas/plan';
import type { RequestHandler } from './$types';

// A survey area and the lines generated over it, in one request and one transaction.
export const POST: RequestHandler = api(async (event) => {
	const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
	const input = await readJson(event, areaWithLinesSchema);
	return json(await plan.createAreaWithLines(user.id, cruise.id, input), { status: 201 });
});
