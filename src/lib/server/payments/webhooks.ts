// Events from the payment service. The signature is checked on the exact bytes received before
// anything else; each event is handled once (its id is stored in the same transaction as its
// effect), and a session is recorded once whichever of webhook and return comes first.
import type Stripe from 'stripe';
import { ApiError } from '../api';
import { db as appDb } from '../db';
import { webhookEvent } from '../db/schema';
import * as checkout from './checkout';
import { stripe, webhookSecret } from './client';

export const MAX_WEBHOOK_BYTES = 512 * 1024;

export function verify(rawBody: string, signature: string | null): Stripe.Event {
	const secret = webhookSecret();
	if (!secret)
		throw new ApiError(
			503,
			'Webhooks are not configured (STRIPE_WEBHOOK_SECRET is empty).',
			'unavailable'
		);
	if (!signature)
		throw new ApiError(400, 'The Stripe-Signature header is missing.', 'bad_signature');
	try {
		return stripe().webhooks.constructEvent(rawBody, signature, secret);
	} catch (e) {
		throw new ApiError(
			400,
			`The signature does not verify: ${(e as Error).message}`,
			'bad_signature'
		);
	}
}

export async function handle(
	event: Stripe.Event
): Promise<{ handled: boolean; outcome?: checkout.Outcome }> {
	const outcome = appDb.transaction((tx) => {
		const fresh = tx
			.insert(webhookEvent)
			.values({ id: event.id, type: event.type })
			.onConflictDoNothing()
			.run();
		if (fresh.changes === 0) return null;
		switch (event.type) {
			case 'checkout.session.completed':
			case 'checkout.session.async_payment_succeeded':
				return checkout.recordCompleted(
					tx,
					event.data.object as unknown as checkout.CompletedSession
				);
			case 'checkout.session.expired':
				return checkout.recordExpired(tx, event.data.object.id);
			case 'charge.refunded':
				return checkout.recordRefund(tx, event.data.object);
			default:
				return { kind: 'ignored', reason: `event type ${event.type}` } as const;
		}
	});
	if (!outcome) return { handled: false };
	await checkout.refundDuplicate(outcome);
	return { handled: true, outcome };
}
