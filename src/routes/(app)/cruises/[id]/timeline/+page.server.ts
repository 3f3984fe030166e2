import { fail } from '@sveltejs/kit';
import { message, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { toUtc } from '$lib/schemas/cruise';
import {
	addItemSchema,
	clockChangeSchema,
	idSchema,
	portCallSchema,
	timingSchema
} from '$lib/schemas/timeline';
import { ApiError } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as timelines from '$lib/server/timeline';
import { WEATHER_MARGIN_RULE } from '$lib/engine/timeline';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const { data } = await timelines.buildOffLoop(access.cruise.id);
	return {
		canEdit: access.isAdmin || access.role === 'chief_scientist',
		input: data.input,
		missing: data.missing,
		notes: data.notes,
		order: data.order,
		unordered: data.unordered,
		ports: data.ports.map((p) => ({ id: p.id, name: p.name })),
		clockChanges: data.clockChanges,
		allocatedReturnAt: data.cruise.returnAt?.getTime() ?? null,
		marginRule: WEATHER_MARGIN_RULE,
		timingForm: await superValidate(timelines.settingsOf(data.cruise), zod4(timingSchema), {
			id: 'timing'
		}),
		clockForm: await superValidate(zod4(clockChangeSchema), { id: 'clock' }),
		portForm: await superValidate(zod4(portCallSchema), { id: 'port' })
	};
};

/** Domain refusals become a message on the page instead of an error page. */
function refused(e: unknown) {
	if (e instanceof ApiError) return fail(e.status, { problem: e.message });
	throw e;
}

export const actions: Actions = {
	timing: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(timingSchema), { id: 'timing' });
		if (!form.valid) return fail(400, { timingForm: form });
		timelines.saveSettings(user.id, cruise.id, form.data);
		return message(form, { type: 'ok', text: 'Timing saved.' });
	},
	clock: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(clockChangeSchema), { id: 'clock' });
		if (!form.valid) return fail(400, { clockForm: form });
		timelines.addClockChange(user.id, cruise.id, {
			at: toUtc(form.data.at)!,
			utcOffsetMinutes: Math.round(form.data.offsetHours * 60),
			note: form.data.note
		});
		return message(form, { type: 'ok', text: 'Clock change added.' });
	},
	unclock: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(idSchema));
		if (!form.valid) return fail(400, { problem: 'Choose a clock change.' });
		try {
			timelines.removeClockChange(user.id, cruise.id, form.data.id);
		} catch (e) {
			return refused(e);
		}
		return { done: 'Clock change removed.' };
	},
	add: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(addItemSchema));
		if (!form.valid) return fail(400, { problem: 'Choose a line or station to add.' });
		const [kind, refId] = form.data.ref.split(':') as ['line' | 'station', string];
		try {
			timelines.addItem(user.id, cruise.id, { kind, refId }, undefined, 'cheapest');
		} catch (e) {
			return refused(e);
		}
		return { done: 'Added to the order of work where it adds the least transit.' };
	},
	port: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(portCallSchema), { id: 'port' });
		if (!form.valid) return fail(400, { portForm: form });
		try {
			timelines.addItem(user.id, cruise.id, {
				kind: 'port_call',
				portId: form.data.portId,
				hours: form.data.hours
			});
		} catch (e) {
			return refused(e);
		}
		return message(form, { type: 'ok', text: 'Port call added at the end; drag it into place.' });
	},
	remove: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(idSchema));
		if (!form.valid) return fail(400, { problem: 'Choose an item.' });
		try {
			timelines.removeItem(user.id, cruise.id, form.data.id);
		} catch (e) {
			return refused(e);
		}
		return { done: 'Taken out of the order (the line or station itself stays in the plan).' };
	}
};
