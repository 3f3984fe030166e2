import { error } from '@sveltejs/kit';
import * as guards from '$lib/server/guards';
import * as invoices from '$lib/server/invoices';
import { receiptNumber } from '$lib/server/payments/checkout';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const inv = invoices.forReader(access, event.params.invoiceId);
	const p = inv.payments.find((x) => x.id === event.params.paymentId);
	if (!p || (p.status !== 'paid' && p.status !== 'refunded') || !p.completedAt)
		error(404, 'No completed payment with that receipt on this invoice.');
	return {
		cruise: { code: access.cruise.code, title: access.cruise.title },
		invoice: {
			id: inv.id,
			number: inv.number,
			description: inv.description,
			currency: inv.currency,
			status: inv.status
		},
		receipt: {
			number: receiptNumber(p),
			amountMinor: p.amountMinor,
			refundedMinor: p.refundedMinor,
			currency: p.currency,
			completedAt: p.completedAt.getTime(),
			payer: p.payerEmail ?? ''
		}
	};
};
