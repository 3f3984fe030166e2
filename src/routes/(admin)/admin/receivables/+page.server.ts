import * as guards from '$lib/server/guards';
import * as invoices from '$lib/server/invoices';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	guards.requireAdmin(event);
	const r = invoices.receivables();
	return {
		open: r.open.map((v) => ({
			id: v.id,
			cruiseId: v.cruiseId,
			cruiseCode: v.cruiseCode,
			number: v.number,
			description: v.description,
			currency: v.currency,
			outstandingMinor: v.outstandingMinor,
			dueAt: v.dueAt?.getTime() ?? null,
			overdue: v.overdue,
			status: v.status
		})),
		totals: r.totals,
		flagged: r.flagged.map((f) => ({
			id: f.payment.id,
			invoiceId: f.payment.invoiceId,
			cruiseId: f.cruiseId,
			cruiseCode: f.cruiseCode,
			number: f.number,
			flag: f.payment.flag!,
			status: f.payment.status
		}))
	};
};
