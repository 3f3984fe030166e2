import { json } from '@sveltejs/kit';
import { depthProfile, EngineInputError } from '$lib/engine/profile';
import { depthProfileRequestSchema } from '$lib/schemas/depthProfile';
import { api, ApiError, readJson } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import type { RequestHandler } from './$types';

/** Stateless: predicted depths along a line (DESIGN.md §6). Any signed-in user or token. */
export const POST: RequestHandler = api(async (event) => {
	guards.requireUser(event);
	const input = await readJson(event, depthProfileRequestSchema);
	try {
		return json(depthProfile(input));
	} catch (e) {
		if (e instanceof EngineInputError)
			throw new ApiError(422, `${e.field}: ${e.message}`, 'invalid', [
				{ field: e.field, message: e.message }
			]);
		throw e;
	}
});
