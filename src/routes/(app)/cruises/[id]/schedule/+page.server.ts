import { fail } from '@sveltejs/kit';
import { ApiError } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as notices from '$lib/server/notices';
import * as publications from '$lib/server/publications';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const canPublish = access.isAdmin || access.role === 'chief_scientist';
	let preview: publications.Preview | null = null;
	let problem: string | null = null;
	if (canPublish)
		try {
			preview = publications.preview(access.cruise.id);
		} catch (e) {
			if (!(e instanceof ApiError)) throw e;
			problem = e.message;
		}
	return {
		canPublish,
		preview,
		problem,
		versions: publications.versions(access.cruise.id),
		log: canPublish ? notices.log(access.cruise.id, 300) : []
	};
};

export const actions: Actions = {
	publish: (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		try {
			return { published: publications.publish(user.id, cruise.id) };
		} catch (e) {
			if (e instanceof ApiError) return fail(e.status, { problem: e.message });
			throw e;
		}
	}
};
