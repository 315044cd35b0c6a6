// The official Stripe SDK, configured from the environment. By default it talks to the local
// fake (fakes/stripe); pointing it at Stripe itself is configuration only (README "Real payments").
import { env } from '$env/dynamic/private';
import Stripe from 'stripe';

let client: Stripe | undefined;

function protocol(): 'http' | 'https' {
	const value = env.STRIPE_API_PROTOCOL || 'http';
	if (value !== 'http' && value !== 'https') {
		throw new Error(`STRIPE_API_PROTOCOL must be http or https, not "${value}"`);
	}
	return value;
}

/** The shared SDK client (created on first use, so building needs no configuration). */
export function stripe(): Stripe {
	client ??= new Stripe(env.STRIPE_SECRET_KEY || 'sk_test_pincer_local', {
		host: env.STRIPE_API_HOST || '127.0.0.1',
		port: Number(env.STRIPE_API_PORT || 12111),
		protocol: protocol(),
		maxNetworkRetries: 1,
		timeout: 20_000,
		telemetry: false,
		appInfo: { name: 'Pincer' }
	});
	return client;
}

/** The recurring per-seat price every subscription is made of. */
export function seatPriceId(): string {
	return env.STRIPE_PRICE_ID || 'price_pincer_seat_monthly';
}

/** The secret that signs webhooks; no default, so an unconfigured server accepts none. */
export function webhookSecret(): string {
	const secret = env.STRIPE_WEBHOOK_SECRET;
	if (!secret) throw new Error('STRIPE_WEBHOOK_SECRET is not set (see .env.example)');
	return secret;
}

/** A sentence for people when a call to Stripe failed; details go to the log. */
export function stripeTrouble(err: unknown, doing: string): string {
	if (err instanceof Stripe.errors.StripeError) {
		if (err instanceof Stripe.errors.StripeConnectionError) {
			return `Stripe could not be reached while ${doing}. Nothing was changed; try again in a moment.`;
		}
		return `Stripe refused ${doing}: ${err.message}`;
	}
	throw err;
}
