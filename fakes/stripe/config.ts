// Settings of the local Stripe fake, read once from the environment.
import Stripe from 'stripe';

function integer(name: string, fallback: number, min: number): number {
	const raw = process.env[name];
	if (raw === undefined || raw === '') return fallback;
	const value = Number(raw);
	if (!Number.isInteger(value) || value < min) {
		console.error(`stripe fake: ${name} must be an integer of at least ${min}, got "${raw}"`);
		process.exit(1);
	}
	return value;
}

const port = integer('PINCER_STRIPE_PORT', 12111, 0);
const secret = process.env.STRIPE_WEBHOOK_SECRET;
if (!secret) {
	console.warn(
		'stripe fake: STRIPE_WEBHOOK_SECRET is unset; signing webhooks with a local development secret'
	);
}

export const config = {
	port,
	/** Where the hosted pages are reached; the port is filled in once listening (port 0 = any). */
	publicUrl: process.env.PINCER_STRIPE_PUBLIC_URL?.replace(/\/+$/, '') ?? '',
	webhookUrl: process.env.PINCER_STRIPE_WEBHOOK_URL || null,
	webhookSecret: secret || 'whsec_pincer_local_development_only',
	webhookAttempts: integer('PINCER_STRIPE_WEBHOOK_ATTEMPTS', 4, 1),
	webhookBackoffMs: integer('PINCER_STRIPE_WEBHOOK_BACKOFF_MS', 200, 0),
	apiVersion: process.env.PINCER_STRIPE_API_VERSION || Stripe.API_VERSION,
	priceId: process.env.PINCER_STRIPE_PRICE_ID || 'price_pincer_seat_monthly',
	priceAmount: integer('PINCER_STRIPE_PRICE_AMOUNT', 2900, 0),
	currency: (process.env.PINCER_STRIPE_CURRENCY || 'usd').toLowerCase()
};
