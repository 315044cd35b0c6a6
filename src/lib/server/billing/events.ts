// What each Stripe event means for a workspace, as pure functions of the event and the
// workspace's current billing columns (webhooks.ts does the I/O around them). Events can arrive
// out of order or late, so a change only applies to the subscription the workspace is on.
import type Stripe from 'stripe';
import { fromMinorUnits } from './money';
import { PAYING } from './status';

/** The billing columns of a workspace row. */
export type BillingState = {
	seats: number;
	subscriptionStatus: string;
	stripeCustomerId: string | null;
	stripeSubscriptionId: string | null;
	currentPeriodEnd: Date | null;
};

/** Ids in an event that lead to its workspace, most specific first. */
export type EventTarget = {
	workspaceId: string | null;
	subscriptionId: string | null;
	customerId: string | null;
};

export type BillingEvent = {
	/** The audit action recorded when the event is applied. */
	action: string;
	target: EventTarget;
	/** The columns to change; null when the event is about another (older) subscription. */
	next: (current: BillingState) => Partial<BillingState> | null;
	/** Facts worth keeping in the audit row besides the changes. */
	facts: Record<string, string | number | null>;
};

export const HANDLED_EVENTS = [
	'checkout.session.completed',
	'customer.subscription.created',
	'customer.subscription.updated',
	'customer.subscription.deleted',
	'invoice.paid',
	'invoice.payment_failed'
] as const;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const ENDED_SUBSCRIPTION = new Set(['canceled', 'incomplete_expired']);
/** States an overdue workspace leaves when an invoice is finally paid. */
const OWING = new Set(['past_due', 'unpaid', 'incomplete']);

function idOf(value: string | { id: string } | null | undefined): string | null {
	if (!value) return null;
	return typeof value === 'string' ? value : value.id;
}

function workspaceIdOf(value: string | null | undefined): string | null {
	return value && UUID.test(value) ? value.toLowerCase() : null;
}

/** Seats paid = the quantities of the subscription's items (Pincer sells one per-seat price). */
export function seatsOf(subscription: Stripe.Subscription): number {
	return subscription.items.data.reduce((sum, item) => sum + (item.quantity ?? 0), 0);
}

/** The end of the current period; in this API version it lives on the items. */
export function periodEndOf(subscription: Stripe.Subscription): Date | null {
	const ends = subscription.items.data.map((item) => item.current_period_end).filter(Boolean);
	return ends.length ? new Date(Math.max(...ends) * 1000) : null;
}

/** Whether a subscription event may steer a workspace that is on `current`. */
function concerns(current: BillingState, subscriptionId: string, live: boolean): boolean {
	if (!current.stripeSubscriptionId || current.stripeSubscriptionId === subscriptionId) return true;
	// A new live subscription replaces one that ended; a stray event of an old one changes nothing.
	return live && !PAYING.has(current.subscriptionStatus);
}

function subscriptionEvent(
	subscription: Stripe.Subscription,
	action: string,
	deleted: boolean
): BillingEvent {
	const status = deleted ? 'canceled' : subscription.status;
	const seats = seatsOf(subscription);
	const periodEnd = periodEndOf(subscription);
	const customerId = idOf(subscription.customer);
	return {
		action,
		target: {
			workspaceId: workspaceIdOf(subscription.metadata?.workspace_id),
			subscriptionId: subscription.id,
			customerId
		},
		next: (current) => {
			if (!concerns(current, subscription.id, !ENDED_SUBSCRIPTION.has(status))) return null;
			return {
				subscriptionStatus: status,
				seats,
				currentPeriodEnd: periodEnd,
				stripeSubscriptionId: subscription.id,
				...(customerId ? { stripeCustomerId: customerId } : {})
			};
		},
		facts: { subscription: subscription.id, status, seats }
	};
}

function checkoutEvent(session: Stripe.Checkout.Session): BillingEvent | null {
	if (session.mode !== 'subscription') return null;
	const subscriptionId = idOf(session.subscription);
	const customerId = idOf(session.customer);
	const paid =
		session.payment_status === 'paid' || session.payment_status === 'no_payment_required';
	return {
		action: 'billing.checkout.complete',
		target: {
			workspaceId: workspaceIdOf(session.client_reference_id ?? session.metadata?.workspace_id),
			subscriptionId,
			customerId
		},
		next: (current) => {
			const patch: Partial<BillingState> = customerId ? { stripeCustomerId: customerId } : {};
			if (!paid || !subscriptionId) return patch;
			if (!concerns(current, subscriptionId, true)) return null;
			if (current.stripeSubscriptionId !== subscriptionId) {
				// Seats and period arrive with the subscription's own event; until then the billing
				// page says it is confirming.
				return {
					...patch,
					stripeSubscriptionId: subscriptionId,
					subscriptionStatus: 'active',
					currentPeriodEnd: null
				};
			}
			return PAYING.has(current.subscriptionStatus)
				? patch
				: { ...patch, subscriptionStatus: 'active' };
		},
		facts: { session: session.id, subscription: subscriptionId, payment: session.payment_status }
	};
}

function invoiceEvent(invoice: Stripe.Invoice, paid: boolean): BillingEvent {
	const details = invoice.parent?.subscription_details ?? null;
	const subscriptionId = idOf(details?.subscription);
	const amount = paid ? invoice.amount_paid : invoice.amount_due;
	return {
		action: paid ? 'billing.invoice.paid' : 'billing.invoice.failed',
		target: {
			workspaceId: workspaceIdOf(details?.metadata?.workspace_id),
			subscriptionId,
			customerId: idOf(invoice.customer)
		},
		next: (current) => {
			if (!subscriptionId || current.stripeSubscriptionId !== subscriptionId) return null;
			if (paid)
				return OWING.has(current.subscriptionStatus) ? { subscriptionStatus: 'active' } : {};
			return current.subscriptionStatus === 'active' ? { subscriptionStatus: 'past_due' } : {};
		},
		facts: {
			invoice: invoice.number ?? invoice.id ?? null,
			amount: fromMinorUnits(amount, invoice.currency),
			currency: invoice.currency.toUpperCase()
		}
	};
}

/** The meaning of an event Pincer handles, or null for any other event. */
export function readEvent(event: Stripe.Event): BillingEvent | null {
	switch (event.type) {
		case 'checkout.session.completed':
			return checkoutEvent(event.data.object);
		case 'customer.subscription.created':
			return subscriptionEvent(event.data.object, 'billing.subscription.create', false);
		case 'customer.subscription.updated':
			return subscriptionEvent(event.data.object, 'billing.subscription.update', false);
		case 'customer.subscription.deleted':
			return subscriptionEvent(event.data.object, 'billing.subscription.cancel', true);
		case 'invoice.paid':
			return invoiceEvent(event.data.object, true);
		case 'invoice.payment_failed':
			return invoiceEvent(event.data.object, false);
		default:
			return null;
	}
}

type Change = { from: string | number | null; to: string | number | null };

const shown = (value: BillingState[keyof BillingState] | undefined) =>
	value instanceof Date ? value.toISOString() : (value ?? null);

/** The columns a patch really changes, as from/to pairs for the audit row. */
export function changesOf(
	current: BillingState,
	patch: Partial<BillingState>
): Record<string, Change> {
	const changes: Record<string, Change> = {};
	for (const key of Object.keys(patch) as (keyof BillingState)[]) {
		const from = shown(current[key]);
		const to = shown(patch[key]);
		if (from !== to) changes[key] = { from, to };
	}
	return changes;
}
