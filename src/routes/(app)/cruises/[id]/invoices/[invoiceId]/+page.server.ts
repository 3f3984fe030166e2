import { fail, redirect } from '@sveltejs/kit';
import { message, setError, superValidate } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { z } from 'zod';
import { parseMajor, toMajorString } from '$lib/money';
import { creditSchema, draftSchema, issueSchema } from '$lib/schemas/invoice';
import { ApiError } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as invoices from '$lib/server/invoices';
import * as checkout from '$lib/server/payments/checkout';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const inv = invoices.forReader(access, event.params.invoiceId);
	const asForm = {
		kind: inv.kind === 'recharge' ? ('recharge' as const) : ('port_call_estimate' as const),
		description: inv.description,
		currency: inv.currency,
		billTo: inv.billTo,
		lines: inv.lines.map((l) => ({
			description: l.description,
			quantity: l.quantity,
			unit: l.unit,
			unitPrice: toMajorString(l.unitMinor, inv.currency),
			taxPct: l.taxPct,
			institution: l.institution ?? ''
		}))
	};
	return {
		invoice: {
			...invoices.toApi(inv),
			billTo: inv.billTo,
			paidMinor: inv.paidMinor,
			creditedMinor: inv.creditedMinor,
			estimatePaidMinor: inv.estimatePaidMinor,
			overdue: inv.overdue,
			flags: inv.payments.filter((p) => p.flag).map((p) => p.flag!)
		},
		receiptIds: inv.payments.filter((p) => p.status === 'paid').map((p) => p.id),
		checkoutState: event.url.searchParams.get('checkout'),
		isAdmin: access.isAdmin,
		canPay: invoices.canPay(access),
		attemptId: invoices.newAttemptId(),
		draftForm: await superValidate(asForm, zod4(draftSchema), { errors: false, id: 'draft' }),
		issueForm: await superValidate(zod4(issueSchema), { id: 'issue' }),
		creditForm: await superValidate(zod4(creditSchema), { id: 'credit' })
	};
};

function refused(e: unknown) {
	if (e instanceof ApiError) return fail(e.status, { problem: e.message });
	throw e;
}

const attemptSchema = z.object({ attemptId: z.string().regex(/^[a-z0-9]{8,40}$/) });

export const actions: Actions = {
	pay: async (event) => {
		const access = guards.requireCruiseRole(event, event.params.id, 'port_agent');
		const form = await superValidate(event.request, zod4(attemptSchema));
		let url: string;
		try {
			url = (
				await checkout.startCheckout(
					access,
					event.params.invoiceId,
					form.valid ? form.data.attemptId : undefined
				)
			).url;
		} catch (e) {
			if (e instanceof ApiError) return fail(e.status, { problem: e.message });
			return fail(502, {
				problem: `The payment service could not be reached (${(e as Error).message}). Nothing was charged; try again shortly.`
			});
		}
		redirect(303, url);
	},
	saveDraft: async (event) => {
		guards.requireAdmin(event);
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id);
		const form = await superValidate(event.request, zod4(draftSchema), { id: 'draft' });
		if (!form.valid) return fail(400, { draftForm: form });
		const { lines, errors } = invoices.fromForm(form.data.currency, form.data.lines);
		if (errors.length) {
			for (const e of errors) setError(form, e.path as `lines[${number}].unitPrice`, e.message);
			return fail(400, { draftForm: form });
		}
		try {
			invoices.updateDraft(user.id, cruise.id, event.params.invoiceId, { ...form.data, lines });
		} catch (e) {
			return refused(e);
		}
		return message(form, { type: 'ok', text: 'Draft saved.' });
	},
	regenerate: async (event) => {
		guards.requireAdmin(event);
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id);
		try {
			invoices.regenerateShipTime(user.id, cruise.id, event.params.invoiceId);
		} catch (e) {
			return refused(e);
		}
		return { done: 'The ship-time lines follow the timeline again.' };
	},
	issue: async (event) => {
		guards.requireAdmin(event);
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id);
		const form = await superValidate(event.request, zod4(issueSchema), { id: 'issue' });
		if (!form.valid) return fail(400, { issueForm: form });
		let number: string;
		try {
			number = invoices.issue(user.id, cruise.id, event.params.invoiceId, form.data.dueInDays);
		} catch (e) {
			return refused(e);
		}
		return { done: `Issued as ${number}.` };
	},
	void: async (event) => {
		guards.requireAdmin(event);
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id);
		try {
			invoices.voidDraft(user.id, cruise.id, event.params.invoiceId);
		} catch (e) {
			return refused(e);
		}
		return { done: 'The draft is void.' };
	},
	credit: async (event) => {
		guards.requireAdmin(event);
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id);
		const form = await superValidate(event.request, zod4(creditSchema), { id: 'credit' });
		if (!form.valid) return fail(400, { creditForm: form });
		const inv = invoices.get(cruise.id, event.params.invoiceId);
		const minor = parseMajor(form.data.amount.replace(',', '.'), inv.currency);
		if (minor === null || minor <= 0)
			return setError(form, 'amount', `Give a positive amount in ${inv.currency}.`);
		let id: string;
		try {
			id = invoices.creditNote(user.id, cruise.id, inv.id, {
				description: form.data.description,
				lines: [
					{ description: form.data.description, quantity: '1', unitMinor: minor, taxPct: '0' }
				]
			});
		} catch (e) {
			if (e instanceof ApiError) return setError(form, 'amount', e.message);
			throw e;
		}
		redirect(303, `/cruises/${cruise.id}/invoices/${id}`);
	},
	finalAccount: async (event) => {
		guards.requireAdmin(event);
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id);
		let id: string;
		try {
			id = invoices.createFinalAccount(user.id, cruise.id, event.params.invoiceId);
		} catch (e) {
			return refused(e);
		}
		redirect(303, `/cruises/${cruise.id}/invoices/${id}`);
	}
};
