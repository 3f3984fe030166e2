import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const user = guards.requireUser(event);
	return {
		cruises: cruises.listFor(user),
		canCreate: guards.canCreateCruise(user),
		// After a deletion the list says which cruise went (the code only; nothing is read back).
		deleted: event.url.searchParams.get('deleted')?.slice(0, 20) ?? null
	};
};
