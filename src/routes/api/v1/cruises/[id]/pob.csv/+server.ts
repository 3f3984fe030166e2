import { api } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as pob from '$lib/server/pob';
import type { RequestHandler } from './$types';

/** The persons-on-board list as CSV (RFC 4180) for the master and the port agent only. */
export const GET: RequestHandler = api((event) => {
	const { cruise } = guards.requireHeldCruiseRole(event, event.params.id, 'master', 'port_agent');
	return new Response(pob.csv(pob.list(cruise.id)), {
		headers: {
			'content-type': 'text/csv; charset=utf-8; header=present',
			'content-disposition': `attachment; filename="${cruise.code}-persons-on-board.csv"`,
			'cache-control': 'private, no-store'
		}
	});
});
