import { fail } from '@sveltejs/kit';
import { message, setError, superValidate, withFiles } from 'sveltekit-superforms';
import { zod4 } from 'sveltekit-superforms/adapters';
import { DOCUMENT_KINDS, type DocumentKind } from '$lib/party';
import {
	applySchema,
	bulkDecisionSchema,
	decideFormSchema,
	idSchema,
	legCapSchema,
	requirementsFormSchema,
	reviewFormSchema,
	uploadFormSchema
} from '$lib/schemas/party';
import { ApiError } from '$lib/server/api';
import * as berths from '$lib/server/berths';
import * as documents from '$lib/server/documents';
import * as guards from '$lib/server/guards';
import { MAX_UPLOAD_BYTES } from '$lib/server/storage/uploads';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const id = access.cruise.id;
	const decides = access.isAdmin || access.role === 'chief_scientist';
	const sails = access.role === 'participant' || access.role === 'chief_scientist';
	const reqs = documents.requirements(id);
	const matrix = decides ? documents.matrix(id) : null;
	// The medical column only for those who may read medical documents.
	if (matrix && !guards.canReadMedical(access))
		matrix.kinds = matrix.kinds.filter((k) => k !== 'medical');
	const reqForm = Object.fromEntries(
		DOCUMENT_KINDS.flatMap((k) => {
			const r = reqs.find((x) => x.kind === k);
			return [
				[k, !!r],
				[`${k}Days`, r?.daysBeforeSailing ?? 30]
			];
		})
	);
	return {
		decides,
		sails,
		seesPob: access.role === 'master' || access.role === 'port_agent',
		legs: berths.legTotals(id),
		vesselBerths: berths.vesselBerths(id),
		mine: berths.applications(id, access.user.id),
		all: decides ? berths.applications(id) : [],
		offers: decides ? berths.offers(id) : [],
		requirements: reqs,
		myDocuments: sails ? documents.mine(access.user.id, id) : null,
		matrix,
		applyForm: await superValidate(zod4(applySchema), { id: 'apply' }),
		uploadForm: await superValidate(zod4(uploadFormSchema), { id: 'upload' }),
		requirementsForm: await superValidate(reqForm, zod4(requirementsFormSchema), {
			id: 'requirements'
		})
	};
};

function refused(e: unknown) {
	if (e instanceof ApiError) return fail(e.status, { problem: e.message });
	throw e;
}

export const actions: Actions = {
	apply: async (event) => {
		const access = guards.requireCruiseRole(
			event,
			event.params.id,
			'participant',
			'chief_scientist'
		);
		const form = await superValidate(event.request, zod4(applySchema), { id: 'apply' });
		if (!form.valid) return fail(400, { applyForm: form });
		try {
			berths.apply(access.user.id, access.cruise.id, form.data);
		} catch (e) {
			if (e instanceof ApiError)
				return setError(form, 'legId', e.message, { status: e.status as 400 });
			throw e;
		}
		return message(form, { type: 'ok', text: 'Application sent. The chief scientist decides.' });
	},
	withdraw: async (event) => {
		const access = guards.requireCruiseRole(event, event.params.id);
		const form = await superValidate(event.request, zod4(idSchema));
		if (!form.valid) return fail(400, { problem: 'Choose an application.' });
		try {
			berths.decide(
				{ id: access.user.id, decides: false },
				access.cruise.id,
				form.data.id,
				'withdrawn'
			);
		} catch (e) {
			return refused(e);
		}
		return { done: 'Application withdrawn.' };
	},
	decide: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(decideFormSchema));
		if (!form.valid) return fail(400, { problem: 'Choose an application and a decision.' });
		try {
			const a = berths.decide(
				{ id: user.id, decides: true },
				cruise.id,
				form.data.id,
				form.data.status,
				form.data.message
			);
			return { done: `${a.name}: ${form.data.status}.` };
		} catch (e) {
			return refused(e);
		}
	},
	bulk: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(bulkDecisionSchema));
		if (!form.valid)
			return fail(400, { problem: 'Tick at least one application and choose a decision.' });
		const r = berths.decideMany(
			{ id: user.id, decides: true },
			cruise.id,
			form.data.ids,
			form.data.status,
			form.data.message
		);
		const done = `${r.done.length} ${form.data.status}.`;
		if (r.refused.length)
			return fail(409, {
				problem: `${done} Not done: ${r.refused.map((x) => `${x.name} — ${x.message}`).join(' ')}`
			});
		return { done };
	},
	berths: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(legCapSchema));
		if (!form.valid) return fail(400, { problem: 'Enter a whole number of berths, 0 or more.' });
		try {
			berths.setLegBerths(user.id, cruise.id, form.data.legId, form.data.berths);
		} catch (e) {
			return refused(e);
		}
		return { done: 'Berths saved.' };
	},
	requirements: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(requirementsFormSchema), {
			id: 'requirements'
		});
		if (!form.valid) return fail(400, { requirementsForm: form });
		const d = form.data as Record<string, boolean | number>;
		const wanted: Partial<Record<DocumentKind, number>> = {};
		for (const k of DOCUMENT_KINDS) if (d[k]) wanted[k] = Number(d[`${k}Days`]);
		documents.setRequirements(user.id, cruise.id, wanted);
		return message(form, { type: 'ok', text: 'Required documents saved.' });
	},
	upload: async (event) => {
		const access = guards.requireCruiseRole(
			event,
			event.params.id,
			'participant',
			'chief_scientist'
		);
		const form = await superValidate(event.request, zod4(uploadFormSchema), { id: 'upload' });
		if (!form.valid) return fail(400, withFiles({ uploadForm: form }));
		const file = form.data.file;
		if (file.size > MAX_UPLOAD_BYTES)
			return setError(form, 'file', 'The file is larger than 10 MB.', { status: 413 });
		try {
			await documents.upload(
				access,
				{ kind: form.data.kind, filename: file.name, expiresOn: form.data.expiresOn || undefined },
				new Uint8Array(await file.arrayBuffer())
			);
		} catch (e) {
			if (e instanceof ApiError)
				return setError(withFiles(form), 'file', e.message, { status: e.status as 400 });
			throw e;
		}
		return withFiles(message(form, { type: 'ok', text: `${file.name} uploaded.` }));
	},
	review: async (event) => {
		const { user, cruise } = guards.requireCruiseRole(event, event.params.id, 'chief_scientist');
		const form = await superValidate(event.request, zod4(reviewFormSchema));
		if (!form.valid)
			return fail(400, { problem: form.errors.reason?.[0] ?? 'Choose accept or reject.' });
		try {
			documents.review(user.id, cruise.id, form.data.id, form.data.status, form.data.reason);
		} catch (e) {
			return refused(e);
		}
		return { done: `Document ${form.data.status}.` };
	},
	removeDocument: async (event) => {
		const access = guards.requireCruiseRole(event, event.params.id);
		const form = await superValidate(event.request, zod4(idSchema));
		if (!form.valid) return fail(400, { problem: 'Choose a document.' });
		try {
			documents.removeOwn(access, form.data.id);
		} catch (e) {
			return refused(e);
		}
		return { done: 'Document removed.' };
	}
};
