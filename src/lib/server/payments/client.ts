// The Stripe SDK client. With a real test or live key and no host settings it talks to Stripe; the
// host/port/protocol settings let it talk to any server that speaks the same HTTP API.
import Stripe from 'stripe';
import { config } from '../config';
import { ApiError } from '../api';

let cached: Stripe | null = null;

export function stripe(): Stripe {
	if (cached) return cached;
	const { secretKey, apiHost, apiPort, apiProtocol } = config.stripe;
	if (!secretKey)
		throw new ApiError(
			503,
			'Payments are not configured (STRIPE_SECRET_KEY is empty).',
			'unavailable'
		);
	cached = new Stripe(secretKey, {
		maxNetworkRetries: 2,
		timeout: 15_000,
		...(apiHost ? { host: apiHost } : {}),
		...(apiPort ? { port: apiPort } : {}),
		...(apiProtocol ? { protocol: apiProtocol } : {})
	});
	return cached;
}

export function webhookSecret(): string {
	return config.stripe.webhookSecret;
}
