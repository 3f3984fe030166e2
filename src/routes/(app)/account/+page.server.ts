import { fail } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from '$lib/schemas/messages';
import { changePasswordSchema, profileSchema, tokenSchema } from '$lib/schemas/auth';
import { noticePreferencesSchema } from '$lib/schemas/notices';
import { createApiToken, listApiTokens, revokeApiToken } from '$lib/server/auth';
import { db } from '$lib/server/db';
import * as guards from '$lib/server/guards';
import * as notices from '$lib/server/notices';
import * as users from '$lib/server/users';
import type { Actions, PageServerLoad } from './$types';

const revokeSchema = z.object({ tokenId: z.string().min(1) });

export const load: PageServerLoad = async (event) => {
	const user = guards.requireUser(event);
	return {
		tokens: listApiTokens(db, user.id),
		profileForm: await superValidate({ name: user.name }, zod4(profileSchema)),
		passwordForm: await superValidate(zod4(changePasswordSchema)),
		tokenForm: await superValidate(zod4(tokenSchema)),
		noticeForm: await superValidate(notices.preferences(user.id), zod4(noticePreferencesSchema), {
			id: 'notices'
		})
	};
};

export const actions: Actions = {
	profile: async (event) => {
		const user = guards.requireUser(event);
		const form = await superValidate(event.request, zod4(profileSchema));
		if (!form.valid) return fail(400, { profileForm: form });
		users.rename(user.id, form.data.name);
		return message(form, { type: 'ok', text: 'Name saved.' });
	},
	password: async (event) => {
		const user = guards.requireUser(event);
		const form = await superValidate(event.request, zod4(changePasswordSchema));
		const { currentPassword, password } = form.data;
		form.data = { currentPassword: '', password: '', confirm: '' }; // never sent back
		if (!form.valid) return fail(400, { passwordForm: form });
		try {
			await users.changePassword(
				user.id,
				currentPassword,
				password,
				event.locals.session?.via === 'cookie' ? event.locals.session.id : undefined
			);
		} catch (e) {
			if (e instanceof users.DomainError) return setError(form, 'currentPassword', e.message);
			throw e;
		}
		return message(form, {
			type: 'ok',
			text: 'Password changed. Your other sessions are signed out and old reset links no longer work.'
		});
	},
	createToken: async (event) => {
		const user = guards.requireUser(event);
		const form = await superValidate(event.request, zod4(tokenSchema));
		if (!form.valid) return fail(400, { tokenForm: form });
		const { token } = createApiToken(db, user.id, form.data.name);
		return { tokenForm: form, newToken: token };
	},
	revokeToken: async (event) => {
		const user = guards.requireUser(event);
		const form = await superValidate(event.request, zod4(revokeSchema));
		if (!form.valid || !revokeApiToken(db, user.id, form.data.tokenId))
			return fail(404, { problem: 'No such token.' });
		return { done: 'Token revoked.' };
	},
	notices: async (event) => {
		const user = guards.requireUser(event);
		const form = await superValidate(event.request, zod4(noticePreferencesSchema), {
			id: 'notices'
		});
		if (!form.valid) return fail(400, { noticeForm: form });
		for (const kind of notices.OPTIONAL_KINDS)
			notices.setPreference(user.id, kind, form.data[kind]);
		return message(form, { type: 'ok', text: 'Notice settings saved.' });
	}
};
