// Public: the payment service calls this without a session; the Stripe-Signature over the raw body
// (checked first, 400 when missing or wrong) is the credential.
import { json } from '@sveltejs/kit';
import { api, ApiError } from '$lib/server/api';
import * as webhooks from '$lib/server/payments/webhooks';
import type { RequestHandler } from './$types';

export const POST: RequestHandler = api(async ({ request }) => {
	const declared = Number(request.headers.get('content-length') ?? 0);
	if (declared > webhooks.MAX_WEBHOOK_BYTES) throw new ApiError(413, 'The event is too large.');
	// The exact bytes received: the signature is over them, so nothing may parse them first.
	const raw = await request.text();
	if (raw.length > webhooks.MAX_WEBHOOK_BYTES) throw new ApiError(413, 'The event is too large.');
	const event = webhooks.verify(raw, request.headers.get('stripe-signature'));
	const { handled } = await webhooks.handle(event);
	return json({ received: true, duplicate: !handled });
});
