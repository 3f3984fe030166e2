import * as documents from '$lib/server/documents';
import * as guards from '$lib/server/guards';
import { config } from '$lib/server/config';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	guards.requireAdmin(event);
	return { days: config.documentRetentionDays, due: documents.retentionDue() };
};

export const actions: Actions = {
	run: async (event) => {
		guards.requireAdmin(event);
		const n = documents.runRetention();
		return { done: `${n} document${n === 1 ? '' : 's'} deleted.` };
	}
};
