// Everything the billing page shows: what Pincer holds (status, seats, dates) and what Stripe
// says now (price, invoices, the subscription's seat count, a checkout's outcome).
import Decimal from 'decimal.js';
import { eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { seatPrice } from '$lib/pricing';
import { db } from '../db';
import { workspaces } from '../db/schema';
import { seatUse } from '../workspaces/members';
import { seatPriceId, stripe } from './client';
import { seatsOf } from './events';
import { fromMinorUnits, minorDigits } from './money';
import { seatsInUse } from './seats';
import { PAYING, statusLabel } from './status';

export type InvoiceRow = {
	id: string;
	number: string | null;
	issued: Date;
	total: string;
	currency: string;
	status: string | null;
	url: string | null;
};

/** How a return from Checkout turned out, as far as Pincer knows yet. */
export type CheckoutOutcome = 'confirming' | 'confirmed' | 'unpaid' | 'left' | 'unavailable';

export type BillingQuery = {
	/** `done` (success URL), `left` (cancel URL) or `unavailable` (sign-up could not start one). */
	checkout: string | null;
	sessionId: string | null;
	/** A checkout to continue to (when the browser could not be redirected there). */
	pay: string | null;
};

const idOf = (value: string | { id: string } | null) =>
	typeof value === 'string' ? value : (value?.id ?? null);

function invoiceRow(invoice: Stripe.Invoice): InvoiceRow {
	return {
		id: invoice.id ?? '',
		number: invoice.number,
		issued: new Date(invoice.created * 1000),
		total: fromMinorUnits(invoice.total, invoice.currency),
		currency: invoice.currency.toUpperCase(),
		status: invoice.status,
		url: invoice.hosted_invoice_url ?? null
	};
}

function priceOf(price: Stripe.Price) {
	return {
		amount: fromMinorUnits(
			price.unit_amount_decimal?.toString() ?? price.unit_amount ?? 0,
			price.currency
		),
		currency: price.currency.toUpperCase(),
		interval: price.recurring?.interval ?? 'month',
		fromStripe: true
	};
}

/** The billing page of one workspace; Stripe's part is best-effort and says when it failed. */
export async function billingOverview(workspaceId: string, query: BillingQuery) {
	const [[workspace], use] = await Promise.all([
		db
			.select({
				name: workspaces.name,
				seats: workspaces.seats,
				subscriptionStatus: workspaces.subscriptionStatus,
				trialEndsAt: workspaces.trialEndsAt,
				currentPeriodEnd: workspaces.currentPeriodEnd,
				customerId: workspaces.stripeCustomerId,
				subscriptionId: workspaces.stripeSubscriptionId
			})
			.from(workspaces)
			.where(eq(workspaces.id, workspaceId)),
		seatUse(db, workspaceId)
	]);
	const subscribed = Boolean(workspace.subscriptionId) && PAYING.has(workspace.subscriptionStatus);
	const ownSession = (session: Stripe.Checkout.Session) =>
		session.client_reference_id === workspaceId ? session : null;

	const [price, invoices, subscription, returned, pending] = await Promise.allSettled([
		stripe().prices.retrieve(seatPriceId()),
		workspace.customerId
			? stripe().invoices.list({ customer: workspace.customerId, limit: 12 })
			: null,
		subscribed && workspace.subscriptionId
			? stripe().subscriptions.retrieve(workspace.subscriptionId)
			: null,
		query.checkout === 'done' && query.sessionId?.startsWith('cs_')
			? stripe().checkout.sessions.retrieve(query.sessionId).then(ownSession)
			: null,
		query.pay?.startsWith('cs_')
			? stripe().checkout.sessions.retrieve(query.pay).then(ownSession)
			: null
	]);
	const value = <T>(result: PromiseSettledResult<T>) =>
		result.status === 'fulfilled' ? result.value : null;
	const failed = [price, invoices, subscription, returned, pending].some(
		(r) => r.status === 'rejected'
	);

	let checkout: CheckoutOutcome | null =
		query.checkout === 'left' || query.checkout === 'unavailable' ? query.checkout : null;
	const session = value(returned);
	if (session) {
		const paid =
			session.payment_status === 'paid' || session.payment_status === 'no_payment_required';
		const arrived =
			workspace.subscriptionId === idOf(session.subscription) &&
			workspace.currentPeriodEnd !== null &&
			PAYING.has(workspace.subscriptionStatus);
		checkout = !paid ? 'unpaid' : arrived ? 'confirmed' : 'confirming';
	}
	const toPay = value(pending);
	const stripePrice = value(price);
	const stripeSubscription = value(subscription);
	const plan = stripePrice ? priceOf(stripePrice) : { ...seatPrice, fromStripe: false };

	return {
		workspaceName: workspace.name,
		status: workspace.subscriptionStatus,
		statusLabel: statusLabel(workspace.subscriptionStatus),
		subscribed,
		trialEndsAt: workspace.trialEndsAt,
		currentPeriodEnd: workspace.currentPeriodEnd,
		seats: workspace.seats,
		members: use.members,
		pending: use.pending,
		inUse: seatsInUse(use),
		price: plan,
		/** Per month for the seats Pincer has confirmed, exact. */
		monthlyTotal: new Decimal(plan.amount)
			.times(workspace.seats)
			.toFixed(minorDigits(plan.currency)),
		hasBillingAccount: Boolean(workspace.customerId),
		/** Seats Stripe bills now, when that differs from what Pincer has confirmed. */
		stripeSeats:
			stripeSubscription && seatsOf(stripeSubscription) !== workspace.seats
				? seatsOf(stripeSubscription)
				: null,
		invoices: (value(invoices)?.data ?? []).map(invoiceRow),
		checkout,
		paymentUrl: toPay?.status === 'open' ? toPay.url : null,
		trouble: failed
			? 'Stripe could not be reached just now; the figures below are what Pincer last heard from it.'
			: null
	};
}

export type BillingOverview = Awaited<ReturnType<typeof billingOverview>>;
