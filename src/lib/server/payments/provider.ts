// The payment provider through its official SDK. With STRIPE_SECRET_KEY and STRIPE_WEBHOOK_SECRET of a
// real account the SDK talks to the provider; the scripts instead start the local fake and add
// STRIPE_API_HOST, STRIPE_API_PORT and STRIPE_API_PROTOCOL, which point the same SDK at it.
import { env } from '$env/dynamic/private';
import Stripe from 'stripe';

let client: Stripe | null = null;

export function paymentsConfigured(): boolean {
	return Boolean(env.STRIPE_SECRET_KEY && env.STRIPE_WEBHOOK_SECRET);
}

export function paymentProvider(): Stripe {
	if (!client) {
		if (!env.STRIPE_SECRET_KEY) throw new Error('STRIPE_SECRET_KEY is not set (see README, Configuration).');
		const port = Number(env.STRIPE_API_PORT);
		client = new Stripe(env.STRIPE_SECRET_KEY, {
			...(env.STRIPE_API_HOST ? { host: env.STRIPE_API_HOST } : {}),
			...(Number.isInteger(port) && port > 0 ? { port } : {}),
			...(env.STRIPE_API_PROTOCOL === 'http' ? { protocol: 'http' as const } : {}),
			// One retry of a dropped connection; every write carries an idempotency key, so a retry never
			// charges or refunds twice.
			maxNetworkRetries: 1,
			timeout: 8000
		});
	}
	return client;
}

/** How old a signed event may be (the SDK's default): an older one is a replay and is refused. */
export const WEBHOOK_TOLERANCE_S = 300;

/** A webhook's event, once its signature is proved with the SDK's own check; throws when it is not. */
export function verifiedEvent(payload: string, signature: string | null): Stripe.Event {
	if (!env.STRIPE_WEBHOOK_SECRET) throw new Error('STRIPE_WEBHOOK_SECRET is not set');
	if (!signature) throw new Error('No Stripe-Signature header');
	return paymentProvider().webhooks.constructEvent(payload, signature, env.STRIPE_WEBHOOK_SECRET, WEBHOOK_TOLERANCE_S);
}
