import { json } from '@sveltejs/kit';
import { api } from '$lib/server/api';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api((event) => {
	const user = guards.requireUser(event);
	return json({
		cruises: cruises.listFor(user).map((c) => ({
			id: c.id,
			code: c.code,
			title: c.title,
			status: c.status,
			role: c.role,
			vessel: c.vesselName,
			departureAt: c.departureAt?.toISOString() ?? null,
			returnAt: c.returnAt?.toISOString() ?? null
		}))
	});
});
