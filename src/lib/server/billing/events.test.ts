import type Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { changesOf, readEvent, type BillingState } from './events';

const WORKSPACE = '6f1d2c3b-4a59-4e6f-8a7b-9c0d1e2f3a4b';
const PERIOD_END = 1_790_000_000;

function subscription(id: string, status: string, quantity: number): Stripe.Subscription {
	return {
		id,
		object: 'subscription',
		status,
		customer: 'cus_quillwort',
		metadata: { workspace_id: WORKSPACE },
		items: {
			object: 'list',
			data: [{ id: 'si_1', quantity, current_period_end: PERIOD_END }]
		}
	} as unknown as Stripe.Subscription;
}

function event(type: string, object: unknown): Stripe.Event {
	return { id: 'evt_1', object: 'event', type, data: { object } } as unknown as Stripe.Event;
}

function invoice(subscriptionId: string, cents: number): Stripe.Invoice {
	return {
		id: 'in_1',
		number: 'QW-0001',
		customer: 'cus_quillwort',
		currency: 'usd',
		amount_due: cents,
		amount_paid: cents,
		parent: {
			type: 'subscription_details',
			subscription_details: { subscription: subscriptionId, metadata: {} }
		}
	} as unknown as Stripe.Invoice;
}

const trial: BillingState = {
	seats: 3,
	subscriptionStatus: 'trialing',
	stripeCustomerId: null,
	stripeSubscriptionId: null,
	currentPeriodEnd: null
};
const paying: BillingState = {
	seats: 5,
	subscriptionStatus: 'active',
	stripeCustomerId: 'cus_quillwort',
	stripeSubscriptionId: 'sub_now',
	currentPeriodEnd: new Date(PERIOD_END * 1000)
};

describe('reading Stripe events', () => {
	it('takes seats, status and period end from a subscription, found by its metadata', () => {
		const read = readEvent(
			event('customer.subscription.created', subscription('sub_now', 'active', 7))
		)!;
		expect(read.target).toEqual({
			workspaceId: WORKSPACE,
			subscriptionId: 'sub_now',
			customerId: 'cus_quillwort'
		});
		expect(read.next(trial)).toEqual({
			subscriptionStatus: 'active',
			seats: 7,
			currentPeriodEnd: new Date(PERIOD_END * 1000),
			stripeSubscriptionId: 'sub_now',
			stripeCustomerId: 'cus_quillwort'
		});
	});

	it('cancels on subscription.deleted, keeping the seats that were paid', () => {
		const read = readEvent(
			event('customer.subscription.deleted', subscription('sub_now', 'canceled', 5))
		)!;
		expect(read.action).toBe('billing.subscription.cancel');
		expect(read.next(paying)).toMatchObject({ subscriptionStatus: 'canceled', seats: 5 });
	});

	it('ignores a late event of an older subscription while a newer one is paid', () => {
		const stale = readEvent(
			event('customer.subscription.deleted', subscription('sub_old', 'canceled', 2))
		)!;
		expect(stale.next(paying)).toBeNull();
		const staleInvoice = readEvent(event('invoice.payment_failed', invoice('sub_old', 1000)))!;
		expect(staleInvoice.next(paying)).toBeNull();
	});

	it('lets a new subscription replace one that ended', () => {
		const ended = { ...paying, subscriptionStatus: 'canceled' };
		const fresh = readEvent(
			event('customer.subscription.created', subscription('sub_new', 'active', 4))
		)!;
		expect(fresh.next(ended)).toMatchObject({ stripeSubscriptionId: 'sub_new', seats: 4 });
	});

	it('marks a paid checkout active and waits for the subscription event for seats', () => {
		const session = {
			id: 'cs_1',
			mode: 'subscription',
			payment_status: 'paid',
			client_reference_id: WORKSPACE,
			customer: 'cus_quillwort',
			subscription: 'sub_now',
			metadata: {}
		};
		const read = readEvent(event('checkout.session.completed', session))!;
		expect(read.target.workspaceId).toBe(WORKSPACE);
		expect(read.next(trial)).toEqual({
			stripeCustomerId: 'cus_quillwort',
			stripeSubscriptionId: 'sub_now',
			subscriptionStatus: 'active',
			currentPeriodEnd: null
		});
		// The subscription event came first: nothing left to change.
		expect(changesOf(paying, read.next(paying)!)).toEqual({});
	});

	it('moves an active workspace to past_due on a failed invoice, and back when paid', () => {
		const failed = readEvent(event('invoice.payment_failed', invoice('sub_now', 14500)))!;
		expect(failed.next(paying)).toEqual({ subscriptionStatus: 'past_due' });
		expect(failed.facts).toMatchObject({ amount: '145.00', currency: 'USD' });
		const paid = readEvent(event('invoice.paid', invoice('sub_now', 14500)))!;
		expect(paid.next({ ...paying, subscriptionStatus: 'past_due' })).toEqual({
			subscriptionStatus: 'active'
		});
		expect(paid.next(paying)).toEqual({});
	});

	it('does not read events it does not handle, nor a workspace id that is not a uuid', () => {
		expect(readEvent(event('customer.created', { id: 'cus_1' }))).toBeNull();
		const odd = subscription('sub_now', 'active', 1);
		odd.metadata = { workspace_id: "x'; drop table workspaces; --" };
		expect(readEvent(event('customer.subscription.updated', odd))!.target.workspaceId).toBeNull();
	});

	it('lists only the columns that change', () => {
		expect(changesOf(paying, { seats: 5, subscriptionStatus: 'past_due' })).toEqual({
			subscriptionStatus: { from: 'active', to: 'past_due' }
		});
	});
});
