import { json } from '@sveltejs/kit';
import { depthProfileRequestSchema } from '$lib/schemas/depthProfile';
import { api, readJson } from '$lib/server/api';
import * as enginePool from '$lib/server/engine-pool';
import * as guards from '$lib/server/guards';
import type { RequestHandler } from './$types';

/**
 * Stateless: predicted depths along a line (DESIGN.md §6). Any signed-in user or token. Computed
 * in the engine pool within its time budget; engine input errors answer 422 naming the field.
 */
export const POST: RequestHandler = api(async (event) => {
	guards.requireUser(event);
	const input = await readJson(event, depthProfileRequestSchema);
	return json(await enginePool.run('depthProfile', input));
});
