import * as guards from '$lib/server/guards';
import * as timeline from '$lib/server/timeline';
import type { PlanCollection } from '$lib/components/map/types';
import type { ShipTime } from './shiptime';
import type { PageServerLoad } from './$types';

// The plan comes through the same JSON route the chart saves to, so the page and the API never
// disagree about its shape. Ship time comes from the one timeline build every page uses, so the
// chart says when an edit pushes the plan past its allocation.
export const load: PageServerLoad = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const res = await event.fetch(`/api/v1/cruises/${access.cruise.id}/plan`);
	const plan = res.ok ? ((await res.json()) as PlanCollection) : null;
	const built = timeline.build(access.cruise.id);
	const t = built.timeline?.totals;
	const shipTime: ShipTime | null = t
		? {
				operatingDays: t.operatingDays,
				allocatedDays: t.allocatedDays,
				overrunDays: t.overrunDays,
				unordered: built.data.unordered.length
			}
		: null;
	return {
		plan,
		planError: res.ok ? null : `The plan could not be loaded (${res.status}).`,
		canEdit: access.isAdmin || access.role === 'chief_scientist',
		shipTime
	};
};
