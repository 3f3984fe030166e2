import { fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { vesselSchema } from '$lib/schemas/vessel';
import * as guards from '$lib/server/guards';
import { DomainError } from '$lib/server/users';
import * as vessels from '$lib/server/vessels';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	guards.requireAdmin(event);
	return {
		form: await superValidate(
			{
				swathAngleDeg: 130,
				swathDepthFactor: 4,
				winchSpeedMPerMin: 60,
				currency: 'EUR',
				transitSpeedKn: 10.5,
				surveySpeedKn: 8
			},
			zod4(vesselSchema),
			{ errors: false }
		)
	};
};

export const actions: Actions = {
	default: async (event) => {
		const user = guards.requireAdmin(event);
		const form = await superValidate(event.request, zod4(vesselSchema));
		if (!form.valid) return fail(400, { form });
		try {
			vessels.create(user.id, form.data);
		} catch (e) {
			if (e instanceof DomainError) return setError(form, 'callSign', e.message);
			throw e;
		}
		redirect(303, '/admin/vessels');
	}
};
