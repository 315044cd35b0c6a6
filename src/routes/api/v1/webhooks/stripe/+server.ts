import { json } from '@sveltejs/kit';
import { receiveStripeWebhook } from '$lib/server/billing';
import type { RequestHandler } from './$types';

// Public by design (allowlisted in the guard-coverage test): Stripe calls it, and the signature
// over the raw body, checked with the shared webhook secret, is the authority.
export const POST: RequestHandler = async ({ request }) => {
	const payload = await request.text();
	const received = await receiveStripeWebhook(payload, request.headers.get('stripe-signature'));
	if (received.status === 400) {
		return json({ error: { code: 'bad_signature', message: received.message } }, { status: 400 });
	}
	return json({ received: true, outcome: received.outcome });
};
