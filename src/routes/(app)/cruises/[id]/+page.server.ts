import { error } from '@sveltejs/kit';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import * as timelines from '$lib/server/timeline';
import { WEATHER_MARGIN_RULE } from '$lib/engine/timeline';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const d = cruises.detail(access.cruise.id);
	if (!d) error(404, 'No such cruise.');
	// Every date and figure here comes from the one timeline build (as on the timeline, the print
	// page and the calendar); the cruise form's departure/return are the allocated window.
	const built = await timelines.buildOffLoop(access.cruise.id);
	const t = built.timeline;
	const fit = timelines.fit(built);
	return {
		detail: d,
		members: cruises.members(access.cruise.id, access),
		glance:
			t && fit
				? {
						operatingDays: fit.operatingDays,
						allocatedDays: fit.allocatedDays,
						marginDays: fit.marginDays,
						cost: t.totals.cost,
						departureAt: new Date(fit.departureAt),
						returnAt: new Date(fit.backInPortAt),
						window: fit.window,
						pastAllocation: fit.pastAllocation,
						warnings: fit.warnings,
						items: built.data.order.length,
						legs: timelines.legSpans(t, built.data)
					}
				: null,
		marginRule: WEATHER_MARGIN_RULE,
		missing: built.data.missing
	};
};
