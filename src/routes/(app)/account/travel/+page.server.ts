import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { travelProfileSchema } from '$lib/schemas/party';
import * as guards from '$lib/server/guards';
import * as pob from '$lib/server/pob';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const user = guards.requireUser(event);
	const p = pob.profile(user.id);
	return {
		form: p
			? await superValidate(p, zod4(travelProfileSchema))
			: await superValidate(zod4(travelProfileSchema))
	};
};

export const actions: Actions = {
	default: async (event) => {
		const user = guards.requireUser(event);
		const form = await superValidate(event.request, zod4(travelProfileSchema));
		if (!form.valid) return fail(400, { form });
		pob.saveProfile(user.id, form.data);
		return message(form, { type: 'ok', text: 'Travel details saved.' });
	}
};
