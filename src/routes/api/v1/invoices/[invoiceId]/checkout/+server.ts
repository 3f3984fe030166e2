import { json } from '@sveltejs/kit';
import { z } from 'zod';
import { api, ApiError, readJson } from '$lib/server/api';
import * as guards from '$lib/server/guards';
import * as invoices from '$lib/server/invoices';
import * as checkout from '$lib/server/payments/checkout';
import type { RequestHandler } from './$types';

const body = z
	.object({
		/** Names one payment attempt: sending the same attempt again returns the same session. */
		attemptId: z
			.string()
			.regex(/^[a-z0-9]{8,40}$/, 'lower-case letters and digits, 8 to 40')
			.optional()
	})
	.strict();

export const POST: RequestHandler = api(async (event) => {
	guards.requireUser(event);
	const inv = invoices.byId(event.params.invoiceId);
	if (!inv) throw new ApiError(404, 'No such invoice.');
	const access = guards.requireCruiseRole(event, inv.cruiseId);
	invoices.requireReader(access);
	const hasBody = Number(event.request.headers.get('content-length') ?? 0) > 0;
	const { attemptId } = hasBody ? await readJson(event, body, 4096) : { attemptId: undefined };
	const session = await checkout.startCheckout(access, inv.id, attemptId);
	return json(session, { status: 201 });
});
