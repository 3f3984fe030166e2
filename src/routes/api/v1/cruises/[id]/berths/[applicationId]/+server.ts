import { json } from '@sveltejs/kit';
import { api, readJson } from '$lib/server/api';
import * as berths from '$lib/server/berths';
import * as guards from '$lib/server/guards';
import { decisionSchema } from '$lib/schemas/party';
import type { RequestHandler } from './$types';

/** The chief scientist decides (confirmed, waitlisted, declined); the applicant withdraws. */
export const PATCH: RequestHandler = api(async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const body = await readJson(event, decisionSchema, 16 * 1024);
	const a = berths.decide(
		{ id: access.user.id, decides: access.isAdmin || access.role === 'chief_scientist' },
		access.cruise.id,
		event.params.applicationId,
		body.status,
		body.message
	);
	return json(berths.toApi(a));
});
