import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { clearanceSchema, deadlineSchema, doneSchema, idSchema } from '$lib/schemas/timeline';
import { ApiError } from '$lib/server/api';
import * as clearances from '$lib/server/clearances';
import * as deadlines from '$lib/server/deadlines';
import * as guards from '$lib/server/guards';
import * as timelines from '$lib/server/timeline';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const built = await timelines.buildOffLoop(access.cruise.id);
	const cl = clearances.list(access.cruise.id, built);
	const returnAt = built.timeline
		? timelines.returnAt(built.timeline)
		: (built.data.cruise.returnAt?.getTime() ?? null);
	return {
		canEdit: access.isAdmin || access.role === 'chief_scientist',
		now: Date.now(),
		sailingAt: built.data.input?.departure.at ?? null,
		returnAt,
		missing: built.data.missing,
		items: built.data.order
			.filter((o) => o.kind !== 'port_call')
			.map((o) => ({ id: o.id, name: o.name, kind: o.kind })),
		clearances: cl,
		checklist: deadlines.list(
			access.cruise.id,
			{ sailingAt: built.data.input?.departure.at ?? null, returnAt },
			cl
		),
		clearanceForm: await superValidate(zod4(clearanceSchema), { id: 'clearance' }),
		deadlineForm: await superValidate(zod4(deadlineSchema), { id: 'deadline' })
	};
};

function refused(e: unknown) {
	if (e instanceof ApiError) return fail(e.status, { problem: e.message });
	throw e;
}

export const actions: Actions = {
	addClearance: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(clearanceSchema), { id: 'clearance' });
		if (!form.valid) return fail(400, { clearanceForm: form });
		try {
			clearances.create(user.id, cruise.id, form.data);
		} catch (e) {
			return refused(e);
		}
		return message(form, { type: 'ok', text: `Clearance for ${form.data.coastalState} added.` });
	},
	saveClearance: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(clearanceSchema));
		if (!form.valid || !form.data.id)
			return fail(400, { problem: 'Check the clearance: name the state and give whole months.' });
		try {
			clearances.update(user.id, cruise.id, form.data.id, form.data);
		} catch (e) {
			return refused(e);
		}
		return { done: `Clearance for ${form.data.coastalState} saved.` };
	},
	submitClearance: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(idSchema));
		if (!form.valid) return fail(400, { problem: 'Choose a clearance.' });
		try {
			clearances.submit(user.id, cruise.id, form.data.id);
		} catch (e) {
			return refused(e);
		}
		return { done: 'Marked as submitted; a copy of the plan as it stands now is kept with it.' };
	},
	removeClearance: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(idSchema));
		if (!form.valid) return fail(400, { problem: 'Choose a clearance.' });
		try {
			clearances.remove(user.id, cruise.id, form.data.id);
		} catch (e) {
			return refused(e);
		}
		return { done: 'Clearance removed.' };
	},
	addDeadline: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(deadlineSchema), { id: 'deadline' });
		if (!form.valid) return fail(400, { deadlineForm: form });
		deadlines.create(user.id, cruise.id, form.data);
		return message(form, { type: 'ok', text: 'Added to the checklist.' });
	},
	usual: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const n = deadlines.addUsual(user.id, cruise.id);
		return { done: n ? `${n} usual items added.` : 'The usual items are all there already.' };
	},
	done: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(doneSchema));
		if (!form.valid) return fail(400, { problem: 'Choose an item.' });
		try {
			deadlines.setDone(user.id, cruise.id, form.data.id, form.data.done);
		} catch (e) {
			return refused(e);
		}
		return { done: form.data.done ? 'Ticked off.' : 'Opened again.' };
	},
	removeDeadline: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(idSchema));
		if (!form.valid) return fail(400, { problem: 'Choose an item.' });
		try {
			deadlines.remove(user.id, cruise.id, form.data.id);
		} catch (e) {
			return refused(e);
		}
		return { done: 'Taken off the checklist.' };
	}
};
