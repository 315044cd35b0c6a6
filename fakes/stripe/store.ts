// In-memory state of the fake: plain records, rendered into Stripe's shapes by objects.ts.
import { randomBytes } from 'node:crypto';
import { config } from './config.ts';
import type { Metadata } from './form.ts';

export type Customer = {
	id: string;
	created: number;
	email: string | null;
	name: string | null;
	phone: string | null;
	description: string | null;
	metadata: Metadata;
	invoicePrefix: string;
	nextInvoiceNumber: number;
};

export type Product = {
	id: string;
	created: number;
	name: string;
	description: string;
	unitLabel: string;
};

export type Price = {
	id: string;
	created: number;
	productId: string;
	unitAmount: number;
	currency: string;
	interval: 'month';
	intervalCount: number;
	nickname: string;
	lookupKey: string;
};

export type CheckoutLine = { id: string; priceId: string; quantity: number };

export type CheckoutSession = {
	id: string;
	created: number;
	expiresAt: number;
	customerId: string | null;
	customerEmail: string | null;
	clientReferenceId: string | null;
	metadata: Metadata;
	subscriptionMetadata: Metadata;
	successUrl: string | null;
	cancelUrl: string | null;
	lines: CheckoutLine[];
	status: 'open' | 'complete' | 'expired';
	subscriptionId: string | null;
	invoiceId: string | null;
};

export type SubscriptionItem = {
	id: string;
	created: number;
	priceId: string;
	quantity: number;
};

export type SubscriptionStatus = 'active' | 'past_due' | 'canceled';

export type Subscription = {
	id: string;
	created: number;
	customerId: string;
	status: SubscriptionStatus;
	items: SubscriptionItem[];
	metadata: Metadata;
	periodStart: number;
	periodEnd: number;
	cancelAtPeriodEnd: boolean;
	canceledAt: number | null;
	endedAt: number | null;
	cancellation: { reason: string; comment: string | null } | null;
	latestInvoiceId: string | null;
	paymentMethodId: string;
};

export type InvoiceLine = {
	id: string;
	subscriptionItemId: string;
	priceId: string;
	quantity: number;
	amount: number;
	description: string;
	periodStart: number;
	periodEnd: number;
	proration: boolean;
};

export type Invoice = {
	id: string;
	created: number;
	customerId: string;
	subscriptionId: string;
	number: string;
	billingReason: 'subscription_create' | 'subscription_cycle' | 'subscription_update';
	status: 'paid' | 'open';
	currency: string;
	lines: InvoiceLine[];
	periodStart: number;
	periodEnd: number;
	paidAt: number | null;
	attemptCount: number;
	nextPaymentAttempt: number | null;
};

export type PortalSession = {
	id: string;
	created: number;
	customerId: string;
	returnUrl: string | null;
};

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789';

export function newId(prefix: string, length = 16): string {
	const bytes = randomBytes(length);
	let out = '';
	for (const byte of bytes) out += ALPHABET[byte % ALPHABET.length];
	return `${prefix}_${out}`;
}

export function now(): number {
	return Math.floor(Date.now() / 1000);
}

/** The same moment one calendar month later (UTC), clamped to the month's last day. */
export function addMonths(timestamp: number, months: number): number {
	const date = new Date(timestamp * 1000);
	const day = date.getUTCDate();
	date.setUTCDate(1);
	date.setUTCMonth(date.getUTCMonth() + months);
	const lastDay = new Date(Date.UTC(date.getUTCFullYear(), date.getUTCMonth() + 1, 0)).getUTCDate();
	date.setUTCDate(Math.min(day, lastDay));
	return Math.floor(date.getTime() / 1000);
}

export const store = {
	customers: new Map<string, Customer>(),
	products: new Map<string, Product>(),
	prices: new Map<string, Price>(),
	sessions: new Map<string, CheckoutSession>(),
	subscriptions: new Map<string, Subscription>(),
	invoices: new Map<string, Invoice>(),
	portalSessions: new Map<string, PortalSession>(),
	/** Idempotency-Key → the first successful answer. */
	idempotent: new Map<string, { fingerprint: string; status: number; body: unknown }>()
};

function seed(): void {
	const created = now();
	const product: Product = {
		id: 'prod_pincer_seat',
		created,
		name: 'Pincer seat',
		description: 'One member seat in a Pincer workspace, billed monthly.',
		unitLabel: 'seat'
	};
	store.products.set(product.id, product);
	store.prices.set(config.priceId, {
		id: config.priceId,
		created,
		productId: product.id,
		unitAmount: config.priceAmount,
		currency: config.currency,
		interval: 'month',
		intervalCount: 1,
		nickname: 'Per seat, monthly',
		lookupKey: 'pincer_seat_monthly'
	});
}

export function resetStore(): void {
	for (const map of Object.values(store)) map.clear();
	seed();
}

seed();

/** Invoices of a customer, newest first. */
export function invoicesOf(customerId: string): Invoice[] {
	return [...store.invoices.values()].filter((i) => i.customerId === customerId).reverse();
}

export function subscriptionsOf(customerId: string): Subscription[] {
	return [...store.subscriptions.values()].filter((s) => s.customerId === customerId).reverse();
}

export function seatCount(subscription: Subscription): number {
	return subscription.items.reduce((sum, item) => sum + item.quantity, 0);
}

export function monthlyAmount(subscription: Subscription): number {
	return subscription.items.reduce(
		(sum, item) => sum + item.quantity * (store.prices.get(item.priceId)?.unitAmount ?? 0),
		0
	);
}
