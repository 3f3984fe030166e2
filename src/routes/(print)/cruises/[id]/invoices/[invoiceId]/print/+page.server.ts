import { error } from '@sveltejs/kit';
import * as guards from '$lib/server/guards';
import * as invoices from '$lib/server/invoices';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const inv = invoices.forReader(access, event.params.invoiceId);
	if (!inv.number) error(404, 'A draft has no printable invoice until it is issued.');
	return {
		cruise: { code: access.cruise.code, title: access.cruise.title },
		invoice: {
			...invoices.toApi(inv),
			billTo: inv.billTo,
			creditedMinor: inv.creditedMinor,
			paidMinor: inv.paidMinor,
			estimatePaidMinor: inv.estimatePaidMinor
		},
		printedAt: Date.now()
	};
};
