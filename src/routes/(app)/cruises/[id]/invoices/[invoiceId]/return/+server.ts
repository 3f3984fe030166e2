// Where the hosted payment page sends the payer back. The webhook may not have arrived yet, so the
// session is looked up at the payment service and recorded when it is paid (idempotent by session).
import { redirect } from '@sveltejs/kit';
import * as guards from '$lib/server/guards';
import * as invoices from '$lib/server/invoices';
import * as checkout from '$lib/server/payments/checkout';
import type { RequestHandler } from './$types';

export const GET: RequestHandler = async (event) => {
	const access = guards.requireCruiseRole(event, event.params.id);
	const back = `/cruises/${access.cruise.id}/invoices/${event.params.invoiceId}`;
	const sessionId = event.url.searchParams.get('session_id') ?? '';
	let state: 'paid' | 'pending' | 'unknown' = 'unknown';
	if (invoices.canRead(access) && /^cs_\w{1,200}$/.test(sessionId))
		state = await checkout.confirmReturn(access.cruise.id, event.params.invoiceId, sessionId);
	redirect(303, `${back}?checkout=${state}`);
};
