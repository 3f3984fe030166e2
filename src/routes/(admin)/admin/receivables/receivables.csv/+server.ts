import * as guards from '$lib/server/guards';
import * as invoices from '$lib/server/invoices';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = (event) => {
	guards.requireAdmin(event);
	const day = new Date().toISOString().slice(0, 10);
	return new Response(invoices.receivablesCsv(), {
		headers: {
			'content-type': 'text/csv; charset=utf-8; header=present',
			'content-disposition': `attachment; filename="receivables-${day}.csv"`
		}
	});
};
