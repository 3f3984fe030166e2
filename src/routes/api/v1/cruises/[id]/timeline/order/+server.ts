import { json } from '@sveltejs/kit';
import { api, readJson } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as timelines from '$lib/server/timeline';
import { orderSchema } from '$lib/schemas/timeline';
import type { RequestHandler } from './$types';

/** The order of work: plan items in sequence, each line with its running direction. */
export const GET: RequestHandler = api(async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const { data } = await timelines.buildOffLoop(access.cruise.id);
	return json({
		items: data.order.map((o) => ({ id: o.id, kind: o.kind, name: o.name, reversed: o.reversed }))
	});
});

export const PUT: RequestHandler = api(async (event) => {
	const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
	const body = await readJson(event, orderSchema);
	timelines.setOrder(user.id, cruise.id, body.items);
	const { timeline } = await timelines.buildOffLoop(cruise.id);
	return json(timeline ? timelines.toApi(timeline) : { events: [], totals: null });
});
