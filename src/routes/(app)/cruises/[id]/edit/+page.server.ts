import { error, fail, redirect } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { cruiseSchema, deleteCruiseSchema, toLocalInput } from '$lib/schemas/cruise';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import { DomainError } from '$lib/server/users';
import * as vessels from '$lib/server/vessels';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
	const c = access.cruise;
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
		ports: vessels.ports(),
		deletion: {
			allowed: cruises.canDelete(access),
			impact: cruises.deleteImpact(c.id),
			form: await superValidate(zod4(deleteCruiseSchema), { id: 'delete' })
		}
	};
};

export const actions: Actions = {
	save: async (event) => {
		const { user, cruise: c } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(cruiseSchema));
		const clash = cruises.codeClash(String(form.data.code ?? '').trim(), c.id);
		if (clash) return setError(form, 'code', clash, { status: 409 });
		if (!form.valid) return fail(400, { form });
		try {
			cruises.update(user.id, c.id, form.data);
		} catch (e) {
			if (e instanceof DomainError)
				return setError(form, (e.field ?? '') as 'code', e.message, {
					status: e.field === 'code' ? 409 : 400
				});
			throw e;
		}
		return message(form, { type: 'ok', text: 'Saved.' });
	},
	delete: async (event) => {
		const access = guards.requireCruiseRole(event, event.params.id);
		if (!cruises.canDelete(access))
			error(
				403,
				access.role === 'chief_scientist'
					? 'A chief scientist may delete only a draft cruise; ask the marine office.'
					: 'Only the marine office or the chief scientist of a draft may delete a cruise.'
			);
		const form = await superValidate(event.request, zod4(deleteCruiseSchema), { id: 'delete' });
		if (!form.valid) return fail(400, { deleteForm: form });
		if (form.data.confirmCode.toLowerCase() !== access.cruise.code.toLowerCase())
			return setError(
				form,
				'confirmCode',
				`Cruise code: type ${access.cruise.code} to confirm; nothing was deleted.`
			);
		cruises.remove(access.user.id, access.cruise);
		redirect(303, `/cruises?deleted=${encodeURIComponent(access.cruise.code)}`);
	}
};
