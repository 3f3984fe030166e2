import * as guards from '$lib/server/guards';
import type { PlanCollection } from '$lib/components/map/types';
import type { PageServerLoad } from './$types';

// The plan comes through the same JSON route the chart saves to, so the page and the API never
// disagree about its shape.
export const load: PageServerLoad = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const res = await event.fetch(`/api/v1/cruises/${access.cruise.id}/plan`);
	const plan = res.ok ? ((await res.json()) as PlanCollection) : null;
	return {
		plan,
		planError: res.ok ? null : `The plan could not be loaded (${res.status}).`,
		canEdit: access.isAdmin || access.role === 'chief_scientist'
	};
};
