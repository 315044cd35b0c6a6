// Stripe webhooks: verify the signature on the raw body, record the event id once, and apply
// the event to its workspace in the same transaction as the audit row.
import { eq } from 'drizzle-orm';
import type Stripe from 'stripe';
import { appendAuditEvent } from '../audit/chain';
import { db, type Transaction } from '../db';
import { webhookEvents, workspaces } from '../db/schema';
import { stripe, webhookSecret } from './client';
import { changesOf, readEvent, type EventTarget } from './events';

export type WebhookOutcome =
	| { status: 400; message: string }
	| { status: 200; outcome: 'applied' | 'duplicate' | 'ignored'; eventId: string };

const billingColumns = {
	id: workspaces.id,
	seats: workspaces.seats,
	subscriptionStatus: workspaces.subscriptionStatus,
	stripeCustomerId: workspaces.stripeCustomerId,
	stripeSubscriptionId: workspaces.stripeSubscriptionId,
	currentPeriodEnd: workspaces.currentPeriodEnd
};

/** The workspace an event concerns, locked for the rest of the transaction. */
async function lockWorkspace(tx: Transaction, target: EventTarget) {
	const lookups = [
		target.workspaceId && eq(workspaces.id, target.workspaceId),
		target.subscriptionId && eq(workspaces.stripeSubscriptionId, target.subscriptionId),
		target.customerId && eq(workspaces.stripeCustomerId, target.customerId)
	];
	for (const where of lookups) {
		if (!where) continue;
		const [row] = await tx
			.select(billingColumns)
			.from(workspaces)
			.where(where)
			.limit(1)
			.for('update');
		if (row) return row;
	}
	return null;
}

/** Applies a verified event once: a second delivery of the same id changes nothing. */
export async function applyStripeEvent(event: Stripe.Event): Promise<WebhookOutcome> {
	const read = readEvent(event);
	const outcome = await db.transaction(async (tx) => {
		const [fresh] = await tx
			.insert(webhookEvents)
			.values({ id: event.id, type: event.type })
			.onConflictDoNothing({ target: webhookEvents.id })
			.returning({ id: webhookEvents.id });
		if (!fresh) return 'duplicate' as const;
		if (!read) return 'ignored' as const;
		const workspace = await lockWorkspace(tx, read.target);
		if (!workspace) return 'ignored' as const;
		await tx
			.update(webhookEvents)
			.set({ workspaceId: workspace.id })
			.where(eq(webhookEvents.id, event.id));
		const patch = read.next(workspace);
		if (!patch) return 'ignored' as const;
		const changes = changesOf(workspace, patch);
		if (Object.keys(changes).length) {
			await tx
				.update(workspaces)
				.set({ ...patch, updatedAt: new Date() })
				.where(eq(workspaces.id, workspace.id));
		}
		await appendAuditEvent(tx, {
			workspaceId: workspace.id,
			actorId: null,
			action: read.action,
			subject: `workspace:${workspace.id}`,
			payload: { stripeEvent: event.id, ...read.facts, changes }
		});
		return 'applied' as const;
	});
	return { status: 200, outcome, eventId: event.id };
}

/**
 * Handles one delivery: `payload` is the request body exactly as received (the signature covers
 * its bytes) and `signature` the Stripe-Signature header. Anything unverifiable is a 400.
 */
export async function receiveStripeWebhook(
	payload: string,
	signature: string | null
): Promise<WebhookOutcome> {
	const secret = webhookSecret();
	let event: Stripe.Event;
	try {
		event = stripe().webhooks.constructEvent(payload, signature ?? '', secret);
	} catch (err) {
		return { status: 400, message: err instanceof Error ? err.message : 'Unverifiable webhook.' };
	}
	return applyStripeEvent(event);
}
