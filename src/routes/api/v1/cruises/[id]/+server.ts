import { json } from '@sveltejs/kit';
import { api, ApiError } from '$lib/server/api';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import * as timelines from '$lib/server/timeline';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api(async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	// The build `toApi` reads, made off the event loop when it is not at hand.
	await timelines.buildOffLoop(access.cruise.id);
	const d = cruises.detail(access.cruise.id);
	if (!d) throw new ApiError(404, 'No such cruise.');
	return json({
		...cruises.toApi(d, access.role),
		// Names and cruise roles for everyone on it; e-mail addresses only for the chief scientist,
		// the master and the marine office.
		people: cruises.members(access.cruise.id, access)
	});
});

/** Deletes the cruise and what goes with it (the answer counts it): admins, or the chief of a draft. */
export const DELETE: RequestHandler = api((event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	if (!cruises.canDelete(access))
		throw new ApiError(
			403,
			'Only the marine office, or the chief scientist of a draft cruise, may delete it.'
		);
	const { impact } = cruises.remove(access.user.id, access.cruise);
	return json({ deleted: { id: access.cruise.id, code: access.cruise.code, ...impact } });
});
