import { error } from '@sveltejs/kit';
import * as clearances from '$lib/server/clearances';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import * as timelines from '$lib/server/timeline';
import { WEATHER_MARGIN_RULE } from '$lib/engine/timeline';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const d = cruises.detail(access.cruise.id);
	if (!d) error(404, 'No such cruise.');
	const built = await timelines.buildOffLoop(access.cruise.id);
	const speeds = Object.fromEntries(
		(built.data.input?.items ?? []).map((i) => [i.id, i.kind === 'line' ? i.surveySpeedKn : null])
	);
	return {
		cruise: {
			code: d.cruise.code,
			title: d.cruise.title,
			vessel: d.vessel ? `${d.vessel.name} (${d.vessel.callSign})` : null
		},
		input: built.data.input,
		missing: built.data.missing,
		timeline: built.timeline,
		legs: built.timeline ? timelines.legSpans(built.timeline, built.data) : [],
		speeds,
		clearances: clearances.list(access.cruise.id, built).map((c) => ({
			id: c.id,
			coastalState: c.coastalState,
			status: c.status,
			dueAt: c.dueAt,
			firstEntryAt: c.firstEntryAt,
			changed: c.changedSinceSubmission
		})),
		fit: timelines.fit(built),
		marginRule: WEATHER_MARGIN_RULE,
		printedAt: Date.now()
	};
};
