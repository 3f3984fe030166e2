import { api } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as publications from '$lib/server/publications';
import * as timelines from '$lib/server/timeline';
import type { RequestHandler } from './$types';

/** The schedule as iCalendar (RFC 5545). Read-only: SEQUENCE numbers come from published versions. */
export const GET: RequestHandler = api(async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	// The build the calendar reads, made off the event loop when it is not at hand.
	await timelines.buildOffLoop(access.cruise.id);
	const text = publications.calendarText(access.cruise.id);
	return new Response(text, {
		headers: {
			'content-type': 'text/calendar; charset=utf-8',
			'content-disposition': `attachment; filename="${access.cruise.code}-schedule.ics"`,
			'cache-control': 'no-store'
		}
	});
});
