import { error } from '@sveltejs/kit';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import * as timelines from '$lib/server/timeline';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const d = cruises.detail(access.cruise.id);
	if (!d) error(404, 'No such cruise.');
	const built = timelines.build(access.cruise.id);
	const t = built.timeline;
	return {
		detail: d,
		members: cruises.members(access.cruise.id, access),
		glance: t
			? {
					operatingDays: t.totals.operatingDays,
					allocatedDays: t.totals.allocatedDays,
					marginDays: t.totals.marginDays,
					cost: t.totals.cost,
					returnAt: new Date(timelines.returnAt(t)),
					warnings: t.warnings,
					items: built.data.order.length
				}
			: null,
		missing: built.data.missing
	};
};
