import { error, fail, redirect } from '@sveltejs/kit';
import { setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { draftSchema } from '$lib/schemas/invoice';
import { ApiError } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as invoices from '$lib/server/invoices';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	if (!invoices.canRead(access))
		error(403, 'Invoices are for the marine office, the chief scientist and the port agent.');
	const all = invoices.list(access.cruise.id);
	return {
		invoices: (access.isAdmin
			? all
			: all.filter((i) => i.status !== 'draft' && i.status !== 'void')
		).map((i) => ({
			id: i.id,
			number: i.number,
			kind: i.kind,
			status: i.status,
			description: i.description,
			amountMinor: i.amountMinor,
			currency: i.currency,
			isCreditNote: i.isCreditNote,
			dueAt: i.dueAt?.getTime() ?? null,
			outstandingMinor: i.outstandingMinor,
			overdue: i.overdue
		})),
		isAdmin: access.isAdmin,
		canPay: invoices.canPay(access),
		now: Date.now(),
		draftForm: await superValidate(
			{
				kind: 'port_call_estimate',
				description: '',
				currency: 'EUR',
				billTo: '',
				lines: [
					{ description: '', quantity: '1', unit: '', unitPrice: '', taxPct: '0', institution: '' }
				]
			},
			zod4(draftSchema),
			{ errors: false }
		)
	};
};

export const actions: Actions = {
	shipTime: async (event) => {
		guards.requireAdmin(event);
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id);
		let id: string;
		try {
			id = invoices.createShipTime(user.id, cruise.id);
		} catch (e) {
			if (e instanceof ApiError) return fail(e.status, { problem: e.message });
			throw e;
		}
		redirect(303, `/cruises/${cruise.id}/invoices/${id}`);
	},
	draft: async (event) => {
		guards.requireAdmin(event);
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id);
		const form = await superValidate(event.request, zod4(draftSchema));
		if (!form.valid) return fail(400, { draftForm: form });
		const { lines, errors } = invoices.fromForm(form.data.currency, form.data.lines);
		if (errors.length) {
			for (const e of errors) setError(form, e.path as `lines[${number}].unitPrice`, e.message);
			return fail(400, { draftForm: form });
		}
		let id: string;
		try {
			id = invoices.createDraft(user.id, cruise.id, { ...form.data, lines });
		} catch (e) {
			if (e instanceof ApiError) return setError(form, '', e.message, { status: e.status as 409 });
			throw e;
		}
		redirect(303, `/cruises/${cruise.id}/invoices/${id}`);
	}
};
