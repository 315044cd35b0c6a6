// What happens to money and subscriptions: checkout completion, seat changes, cancellation and
// renewals. Each operation changes the store, then publishes its events in order; the returned
// promise settles once those events were delivered (or given up).
import { invalid, noSuch } from './http.ts';
import { renderInvoice, renderSession, renderSubscription, type Json } from './objects.ts';
import {
	addMonths,
	newId,
	now,
	store,
	type CheckoutSession,
	type Customer,
	type Invoice,
	type InvoiceLine,
	type Subscription
} from './store.ts';
import { publish, type EventRequest } from './webhooks.ts';
import type { Metadata } from './form.ts';

const settle = (runs: Promise<unknown>[]): Promise<void> => Promise.all(runs).then(() => undefined);

export function formatMoney(amount: number, currency: string): string {
	return new Intl.NumberFormat('en-US', { style: 'currency', currency }).format(amount / 100);
}

export function createCustomer(fields: {
	email?: string | null;
	name?: string | null;
	phone?: string | null;
	description?: string | null;
	metadata?: Metadata;
}): Customer {
	const customer: Customer = {
		id: newId('cus', 14),
		created: now(),
		email: fields.email ?? null,
		name: fields.name ?? null,
		phone: fields.phone ?? null,
		description: fields.description ?? null,
		metadata: fields.metadata ?? {},
		invoicePrefix: newId('x', 8).slice(2).toUpperCase(),
		nextInvoiceNumber: 1
	};
	store.customers.set(customer.id, customer);
	return customer;
}

function lineFor(
	sub: Subscription,
	itemIndex: number,
	quantity: number,
	amount: number,
	period: { start: number; end: number },
	proration: boolean
): InvoiceLine {
	const item = sub.items[itemIndex];
	const price = store.prices.get(item.priceId)!;
	const product = store.products.get(price.productId);
	const each = formatMoney(price.unitAmount, price.currency);
	return {
		id: newId('il', 24),
		subscriptionItemId: item.id,
		priceId: price.id,
		quantity,
		amount,
		description: proration
			? `Remaining time on ${quantity} × ${product?.name ?? 'seat'} (at ${each} / month)`
			: `${quantity} × ${product?.name ?? 'seat'} (at ${each} / month)`,
		periodStart: period.start,
		periodEnd: period.end,
		proration
	};
}

function issueInvoice(
	sub: Subscription,
	reason: Invoice['billingReason'],
	lines: InvoiceLine[],
	paid: boolean,
	period: { start: number; end: number }
): Invoice {
	const customer = store.customers.get(sub.customerId)!;
	const created = now();
	const price = store.prices.get(sub.items[0].priceId)!;
	const invoice: Invoice = {
		id: newId('in', 24),
		created,
		customerId: sub.customerId,
		subscriptionId: sub.id,
		number: `${customer.invoicePrefix}-${String(customer.nextInvoiceNumber++).padStart(4, '0')}`,
		billingReason: reason,
		status: paid ? 'paid' : 'open',
		currency: price.currency,
		lines,
		periodStart: period.start,
		periodEnd: period.end,
		paidAt: paid ? created : null,
		attemptCount: 1,
		nextPaymentAttempt: paid ? null : created + 3 * 24 * 3600
	};
	store.invoices.set(invoice.id, invoice);
	sub.latestInvoiceId = invoice.id;
	return invoice;
}

function fullLines(sub: Subscription): InvoiceLine[] {
	return sub.items.map((item, index) => {
		const unit = store.prices.get(item.priceId)!.unitAmount;
		return lineFor(
			sub,
			index,
			item.quantity,
			item.quantity * unit,
			{ start: sub.periodStart, end: sub.periodEnd },
			false
		);
	});
}

/** A paid checkout: customer (if needed), active subscription, paid invoice, three events. */
export function completeCheckout(
	session: CheckoutSession,
	email: string | null
): { subscription: Subscription; invoice: Invoice; delivered: Promise<void> } {
	const created = now();
	if (!session.customerId) {
		session.customerId = createCustomer({ email: session.customerEmail ?? email }).id;
	}
	const subscription: Subscription = {
		id: newId('sub', 24),
		created,
		customerId: session.customerId,
		status: 'active',
		items: session.lines.map((line) => ({
			id: newId('si', 14),
			created,
			priceId: line.priceId,
			quantity: line.quantity
		})),
		metadata: { ...session.subscriptionMetadata },
		periodStart: created,
		periodEnd: addMonths(created, 1),
		cancelAtPeriodEnd: false,
		canceledAt: null,
		endedAt: null,
		cancellation: null,
		latestInvoiceId: null,
		paymentMethodId: newId('pm', 24)
	};
	store.subscriptions.set(subscription.id, subscription);
	const invoice = issueInvoice(subscription, 'subscription_create', fullLines(subscription), true, {
		start: created,
		end: created
	});
	session.status = 'complete';
	session.subscriptionId = subscription.id;
	session.invoiceId = invoice.id;
	const delivered = settle([
		publish('checkout.session.completed', renderSession(session)),
		publish('customer.subscription.created', renderSubscription(subscription)),
		publish('invoice.paid', renderInvoice(invoice))
	]);
	return { subscription, invoice, delivered };
}

export type SubscriptionChange = {
	items?: { id: string; quantity?: number; priceId?: string }[];
	metadata?: Metadata;
	cancelAtPeriodEnd?: boolean;
	prorationBehavior?: 'always_invoice' | 'create_prorations' | 'none';
};

function same(a: unknown, b: unknown): boolean {
	return JSON.stringify(a) === JSON.stringify(b);
}

/**
 * Applies an update; sends customer.subscription.updated (with previous_attributes) when
 * anything changed, and with `always_invoice` bills added seats for the rest of the period.
 */
export function updateSubscription(
	sub: Subscription,
	change: SubscriptionChange,
	request?: EventRequest
): Promise<void> {
	if (sub.status === 'canceled' && (change.items || change.cancelAtPeriodEnd !== undefined)) {
		throw invalid(
			'A canceled subscription accepts only metadata and cancellation_details updates.',
			change.items ? 'items' : 'cancel_at_period_end'
		);
	}
	const before = renderSubscription(sub);
	const oldQuantities = sub.items.map((item) => item.quantity);
	for (const update of change.items ?? []) {
		const item = sub.items.find((i) => i.id === update.id)!;
		if (update.quantity !== undefined) item.quantity = update.quantity;
		if (update.priceId !== undefined) item.priceId = update.priceId;
	}
	if (change.metadata) sub.metadata = change.metadata;
	if (change.cancelAtPeriodEnd !== undefined) sub.cancelAtPeriodEnd = change.cancelAtPeriodEnd;

	const runs: Promise<unknown>[] = [];
	let prorationInvoice: Invoice | null = null;
	if (change.prorationBehavior === 'always_invoice') {
		const t = now();
		const share = Math.max(0, sub.periodEnd - t) / (sub.periodEnd - sub.periodStart);
		const lines = sub.items.flatMap((item, index) => {
			const added = item.quantity - oldQuantities[index];
			if (added <= 0) return [];
			const unit = store.prices.get(item.priceId)!.unitAmount;
			const amount = Math.round(added * unit * share);
			return [lineFor(sub, index, added, amount, { start: t, end: sub.periodEnd }, true)];
		});
		if (lines.length) {
			prorationInvoice = issueInvoice(sub, 'subscription_update', lines, true, {
				start: t,
				end: t
			});
		}
	}

	const after = renderSubscription(sub);
	const previous: Json = {};
	for (const key of ['items', 'metadata', 'cancel_at_period_end', 'cancel_at', 'latest_invoice']) {
		if (!same(before[key], after[key])) previous[key] = before[key];
	}
	if (Object.keys(previous).length) {
		runs.push(publish('customer.subscription.updated', after, { previous, request }));
	}
	if (prorationInvoice) {
		runs.push(publish('invoice.paid', renderInvoice(prorationInvoice), { request }));
	}
	return settle(runs);
}

export function cancelSubscription(
	sub: Subscription,
	reason: 'cancellation_requested' | 'payment_failed' | 'payment_disputed',
	comment: string | null,
	request?: EventRequest
): Promise<void> {
	// Stripe treats a canceled subscription as gone for a second cancel.
	if (sub.status === 'canceled') throw noSuch('subscription', sub.id);
	const t = now();
	sub.status = 'canceled';
	sub.canceledAt = t;
	sub.endedAt = t;
	sub.cancelAtPeriodEnd = false;
	sub.cancellation = { reason, comment };
	return publish('customer.subscription.deleted', renderSubscription(sub), { request }).then(
		() => undefined
	);
}

/**
 * Runs the subscription's next renewal now: the period moves one month on and a cycle invoice
 * is charged. A failed charge leaves the invoice open and the subscription past_due.
 */
export function renew(
	sub: Subscription,
	outcome: 'succeed' | 'fail'
): { invoice: Invoice | null; delivered: Promise<void> } {
	if (sub.status === 'canceled') throw invalid(`Subscription ${sub.id} is canceled.`, 'id');
	if (sub.cancelAtPeriodEnd) {
		return { invoice: null, delivered: cancelSubscription(sub, 'cancellation_requested', null) };
	}
	const before = renderSubscription(sub);
	// A cycle invoice's own period is the one just ended; its lines cover the new one.
	const ended = { start: sub.periodStart, end: sub.periodEnd };
	sub.periodStart = sub.periodEnd;
	sub.periodEnd = addMonths(sub.periodStart, 1);
	const paid = outcome === 'succeed';
	const invoice = issueInvoice(sub, 'subscription_cycle', fullLines(sub), paid, ended);
	sub.status = paid ? 'active' : 'past_due';
	const after = renderSubscription(sub);
	const previous: Json = {};
	for (const key of ['items', 'latest_invoice', 'status']) {
		if (!same(before[key], after[key])) previous[key] = before[key];
	}
	const runs = paid
		? [
				publish('customer.subscription.updated', after, { previous }),
				publish('invoice.paid', renderInvoice(invoice))
			]
		: [
				publish('invoice.payment_failed', renderInvoice(invoice)),
				publish('customer.subscription.updated', after, { previous })
			];
	return { invoice, delivered: settle(runs) };
}
