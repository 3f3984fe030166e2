import { json } from '@sveltejs/kit';
import { api } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as invoices from '$lib/server/invoices';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = api((event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	invoices.requireReader(access);
	const all = invoices.list(access.cruise.id);
	// Drafts are the marine office's working copies.
	const shown = access.isAdmin
		? all
		: all.filter((i) => i.status !== 'draft' && i.status !== 'void');
	return json({ invoices: shown.map(invoices.toApi) });
});
