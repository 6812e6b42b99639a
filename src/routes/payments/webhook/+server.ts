import { text } from '@sveltejs/kit';
import { handlePaymentWebhook } from '$lib/server/workshops';

/** The payment provider's webhook: verified with the SDK, then acted on once per event. */
export async function POST({ request, getClientAddress }) {
	const answer = await handlePaymentWebhook(await request.text(), request.headers.get('stripe-signature'), getClientAddress());
	return text(answer.message, { status: answer.status });
}
