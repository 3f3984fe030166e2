import { fail } from '@sveltejs/kit';
import { config } from '$lib/server/config';
import * as guards from '$lib/server/guards';
import { readCaught } from '$lib/server/mail/catcher';
import * as outbox from '$lib/server/mail/outbox';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	guards.requireAdmin(event);
	return {
		outbox: outbox.recent(100),
		catcherInUse: config.catcherInUse,
		caught: config.catcherInUse ? await readCaught(config.mailCatcherDir, 50) : []
	};
};

export const actions: Actions = {
	/** "Retry now" for one message, or for every failed one shown. */
	retry: async (event) => {
		guards.requireAdmin(event);
		const form = await event.request.formData();
		const ids = form
			.getAll('id')
			.filter((v): v is string => typeof v === 'string' && v.length > 0 && v.length <= 64)
			.slice(0, 500);
		if (!ids.length) return fail(400, { retried: 0, message: 'Choose a message to retry.' });
		const retried = outbox.retryNow(ids);
		return { retried, message: `${retried} message${retried === 1 ? '' : 's'} queued again.` };
	}
};
