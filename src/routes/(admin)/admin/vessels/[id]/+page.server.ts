import { error, fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { vesselSchema } from '$lib/schemas/vessel';
import * as guards from '$lib/server/guards';
import { DomainError } from '$lib/server/users';
import * as vessels from '$lib/server/vessels';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	guards.requireAdmin(event);
	const v = vessels.get(event.params.id);
	if (!v) error(404, 'No such vessel.');
	return {
		name: v.name,
		form: await superValidate({ ...v, dayRate: v.dayRateMinor / 100 }, zod4(vesselSchema))
	};
};

export const actions: Actions = {
	default: async (event) => {
		const user = guards.requireAdmin(event);
		if (!vessels.get(event.params.id)) error(404, 'No such vessel.');
		const form = await superValidate(event.request, zod4(vesselSchema));
		if (!form.valid) return fail(400, { form });
		try {
			vessels.update(user.id, event.params.id, form.data);
		} catch (e) {
			if (e instanceof DomainError) return setError(form, 'callSign', e.message);
			throw e;
		}
		return message(form, { type: 'ok', text: 'Saved.' });
	}
};
