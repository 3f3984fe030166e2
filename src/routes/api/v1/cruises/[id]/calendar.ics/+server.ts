import { api } from '$lib/server/api';
import * as calendar from '$lib/server/calendar';
import * as guards from '$lib/server/guards';
import type { RequestHandler } from './$types';

/** The schedule as iCalendar (RFC 5545); each export records SEQUENCE numbers for changed items. */
export const GET: RequestHandler = api((event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const text = calendar.ics(access.cruise.id);
	return new Response(text, {
		headers: {
			'content-type': 'text/calendar; charset=utf-8',
			'content-disposition': `attachment; filename="${access.cruise.code}-schedule.ics"`,
			'cache-control': 'no-store'
		}
	});
});
