import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { cruiseSchema, toLocalInput } from '$lib/schemas/cruise';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import { DomainError } from '$lib/server/users';
import * as vessels from '$lib/server/vessels';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const { cruise: c } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
	const initial = {
		code: c.code,
		title: c.title,
		status: c.status,
		vesselId: c.vesselId ?? '',
		departurePortId: c.departurePortId ?? '',
		returnPortId: c.returnPortId ?? '',
		departureAt: toLocalInput(c.departureAt),
		returnAt: toLocalInput(c.returnAt),
		allocatedDays: c.allocatedDays,
		weatherMarginPct: c.weatherMarginPct,
		depthModel: c.depthModel
	};
	return {
		form: await superValidate(initial, zod4(cruiseSchema)),
		vessels: vessels.list(),
		ports: vessels.ports()
	};
};

export const actions: Actions = {
	default: async (event) => {
		const { user, cruise: c } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(cruiseSchema));
		if (!form.valid) return fail(400, { form });
		try {
			cruises.update(user.id, c.id, form.data);
		} catch (e) {
			if (e instanceof DomainError)
				return setError(form, (e.field ?? '') as 'code', e.message, { status: 409 });
			throw e;
		}
		return message(form, { type: 'ok', text: 'Saved.' });
	}
};
