import { error } from '@sveltejs/kit';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import type { PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const d = cruises.detail(access.cruise.id);
	if (!d) error(404, 'No such cruise.');
	return { detail: d, members: cruises.members(access.cruise.id) };
};
