import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from '$lib/schemas/messages';
import { memberInviteSchema, memberRoleSchema } from '$lib/schemas/cruise';
import * as cruises from '$lib/server/cruises';
import * as guards from '$lib/server/guards';
import { DomainError } from '$lib/server/users';
import type { Actions, PageServerLoad } from './$types';

const removeSchema = z.object({ userId: z.string().min(1) });
const revokeSchema = z.object({ invitationId: z.string().min(1) });

export const load: PageServerLoad = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const canManage = access.isAdmin || access.role === 'chief_scientist';
	return {
		members: cruises.members(access.cruise.id, access),
		seesEmails: cruises.seesEmails(access),
		invitations: canManage ? cruises.pendingInvitations(access.cruise.id) : [],
		canManage,
		me: access.user.id,
		inviteForm: await superValidate(zod4(memberInviteSchema))
	};
};

export const actions: Actions = {
	invite: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(memberInviteSchema));
		if (!form.valid) return fail(400, { inviteForm: form });
		let added: boolean;
		try {
			added = cruises.invite(user, cruise, form.data.email, form.data.role).added;
		} catch (e) {
			if (e instanceof DomainError) return setError(form, 'email', e.message, { status: 409 });
			throw e;
		}
		return message(form, {
			type: 'ok',
			text: added
				? `${form.data.email} was added and told by e-mail.`
				: `An invitation is on its way to ${form.data.email}.`
		});
	},
	role: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(memberRoleSchema));
		if (!form.valid) return fail(400, { problem: 'Choose a person and a role.' });
		try {
			cruises.changeRole(user.id, cruise.id, form.data.userId, form.data.role);
		} catch (e) {
			if (e instanceof DomainError) return fail(e.status, { problem: e.message });
			throw e;
		}
		return { done: 'Role changed.' };
	},
	remove: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(removeSchema));
		if (!form.valid) return fail(400, { problem: 'Choose a person.' });
		try {
			cruises.removeMember(user.id, cruise.id, form.data.userId);
		} catch (e) {
			if (e instanceof DomainError) return fail(e.status, { problem: e.message });
			throw e;
		}
		return { done: 'Removed from the cruise.' };
	},
	revoke: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(revokeSchema));
		if (!form.valid) return fail(400, { problem: 'Choose an invitation.' });
		try {
			cruises.revokeInvitation(user.id, cruise.id, form.data.invitationId);
		} catch (e) {
			if (e instanceof DomainError) return fail(e.status, { problem: e.message });
			throw e;
		}
		return { done: 'Invitation withdrawn.' };
	}
};
