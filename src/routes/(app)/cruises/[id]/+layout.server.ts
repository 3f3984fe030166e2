import * as guards from '$lib/server/guards';
import * as invoices from '$lib/server/invoices';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	return {
		cruiseNav: {
			id: access.cruise.id,
			code: access.cruise.code,
			title: access.cruise.title,
			role: access.role,
			canEdit: access.isAdmin || access.role === 'chief_scientist',
			seesInvoices: invoices.canRead(access)
		}
	};
};
