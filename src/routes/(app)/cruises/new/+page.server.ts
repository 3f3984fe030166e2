import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { cruiseSchema } from '$lib/schemas/cruise';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import { DomainError } from '$lib/server/users';
import * as vessels from '$lib/server/vessels';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	guards.requireCruiseCreator(event);
	return {
		form: await superValidate(zod4(cruiseSchema)),
		vessels: vessels.list(),
		ports: vessels.ports()
	};
};

export const actions: Actions = {
	default: async (event) => {
		const user = guards.requireCruiseCreator(event);
		const form = await superValidate(event.request, zod4(cruiseSchema));
		// A taken code is said at once, beside any other problem, not only after the rest is right.
		const clash = cruises.codeClash(String(form.data.code ?? '').trim());
		if (clash) return setError(form, 'code', clash, { status: 409 });
		if (!form.valid) return fail(400, { form });
		let id: string;
		try {
			id = cruises.create(user.id, form.data);
		} catch (e) {
			if (e instanceof DomainError)
				return setError(form, (e.field ?? '') as 'code', e.message, {
					status: e.field === 'code' ? 409 : 400
				});
			throw e;
		}
		redirect(303, `/cruises/${id}`);
	}
};
