import { error, fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { leadFlagSchema, siteInviteSchema } from '$lib/schemas/auth';
import * as guards from '$lib/server/guards';
import * as users from '$lib/server/users';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	guards.requireAdmin(event);
	return { users: users.list(), form: await superValidate(zod4(siteInviteSchema)) };
};

export const actions: Actions = {
	invite: async (event) => {
		const admin = guards.requireAdmin(event);
		const form = await superValidate(event.request, zod4(siteInviteSchema));
		if (!form.valid) return fail(400, { form });
		try {
			users.inviteToSite(admin, form.data.email, form.data.role);
		} catch (e) {
			if (e instanceof users.DomainError)
				return setError(form, 'email', e.message, { status: 409 });
			throw e;
		}
		return message(form, {
			type: 'ok',
			text: `An invitation is on its way to ${form.data.email}.`
		});
	},
	lead: async (event) => {
		const admin = guards.requireAdmin(event);
		const form = await superValidate(event.request, zod4(leadFlagSchema));
		if (!form.valid) error(400, 'Choose a person.');
		try {
			users.setCanLeadCruises(admin.id, form.data.userId, form.data.allowed);
		} catch (e) {
			if (e instanceof users.DomainError) error(e.status, e.message);
			throw e;
		}
		return { done: form.data.allowed ? 'May now lead cruises.' : 'May no longer lead cruises.' };
	}
};
