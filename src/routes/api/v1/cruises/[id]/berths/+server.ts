import { json } from '@sveltejs/kit';
import { api, ApiError, readJson } from '$lib/server/api';
import * as berths from '$lib/server/berths';
import * as guards from '$lib/server/guards';
import { applySchema } from '$lib/schemas/party';
import type { RequestHandler } from './$types';

/** Leg totals for everyone on the cruise; all applications for the chief scientist and admins. */
export const GET: RequestHandler = api((event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const seesAll = access.isAdmin || access.role === 'chief_scientist';
	return json({
		legs: berths.legTotals(access.cruise.id),
		applications: berths
			.applications(access.cruise.id, seesAll ? undefined : access.user.id)
			.map(berths.toApi)
	});
});

export const POST: RequestHandler = api(async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id, 'participant', 'chief_scientist');
	if (!access.role) throw new ApiError(403, 'Only participants of this cruise apply for berths.');
	const input = await readJson(event, applySchema, 16 * 1024);
	const a = berths.apply(access.user.id, access.cruise.id, input);
	return json(berths.toApi(a), { status: 201 });
});
