// Sending an admin to Stripe: Checkout to start (or restart) a subscription, the billing portal
// to manage the card and see receipts.
import { eq } from 'drizzle-orm';
import { appendAuditEvent } from '../audit/chain';
import { db } from '../db';
import { workspaces } from '../db/schema';
import { seatUse } from '../workspaces/members';
import { seatPriceId, stripe, stripeTrouble } from './client';
import { belowUseMessage, type Acting, type Refusal } from './seats';
import { PAYING } from './status';

/** Where Stripe sends the browser back to: the billing page, which shows the outcome. */
export const billingPath = '/app/settings/billing';

/**
 * Creates a Checkout Session for `seats` seats of the per-seat price, in subscription mode, for
 * the workspace's Stripe customer (created on first use). `origin` is the app's public origin.
 */
export async function startCheckout(
	acting: Acting & { email: string },
	seats: number,
	origin: string
): Promise<{ ok: true; url: string; sessionId: string } | Refusal> {
	try {
		return await db.transaction(async (tx) => {
			const use = await seatUse(tx, acting.workspaceId);
			const [workspace] = await tx
				.select({
					status: workspaces.subscriptionStatus,
					customerId: workspaces.stripeCustomerId,
					subscriptionId: workspaces.stripeSubscriptionId
				})
				.from(workspaces)
				.where(eq(workspaces.id, acting.workspaceId));
			if (workspace.subscriptionId && PAYING.has(workspace.status)) {
				return {
					ok: false as const,
					message: 'This workspace already has a subscription: change its seat count instead.'
				};
			}
			const tooFew = belowUseMessage(use, seats);
			if (tooFew) return { ok: false as const, message: tooFew };

			let customerId = workspace.customerId;
			if (!customerId) {
				const customer = await stripe().customers.create({
					email: acting.email,
					name: use.name,
					metadata: { workspace_id: acting.workspaceId }
				});
				customerId = customer.id;
				await tx
					.update(workspaces)
					.set({ stripeCustomerId: customerId, updatedAt: new Date() })
					.where(eq(workspaces.id, acting.workspaceId));
			}
			const back = `${origin}${billingPath}`;
			const session = await stripe().checkout.sessions.create({
				mode: 'subscription',
				customer: customerId,
				line_items: [{ price: seatPriceId(), quantity: seats }],
				client_reference_id: acting.workspaceId,
				metadata: { workspace_id: acting.workspaceId },
				subscription_data: { metadata: { workspace_id: acting.workspaceId } },
				success_url: `${back}?checkout=done&session_id={CHECKOUT_SESSION_ID}`,
				cancel_url: `${back}?checkout=left`
			});
			if (!session.url) throw new Error(`checkout session ${session.id} came back without a url`);
			await appendAuditEvent(tx, {
				workspaceId: acting.workspaceId,
				actorId: acting.actorId,
				action: 'billing.checkout.start',
				subject: `workspace:${acting.workspaceId}`,
				payload: { seats, session: session.id, customer: customerId }
			});
			return { ok: true as const, url: session.url, sessionId: session.id };
		});
	} catch (err) {
		return { ok: false, message: stripeTrouble(err, 'starting the checkout') };
	}
}

/** A billing-portal session for the workspace's Stripe customer, returning to the billing page. */
export async function openPortal(
	workspaceId: string,
	origin: string
): Promise<{ ok: true; url: string } | Refusal> {
	const [workspace] = await db
		.select({ customerId: workspaces.stripeCustomerId })
		.from(workspaces)
		.where(eq(workspaces.id, workspaceId));
	if (!workspace?.customerId) {
		return { ok: false, message: 'There is no billing account yet: subscribe first.' };
	}
	try {
		const portal = await stripe().billingPortal.sessions.create({
			customer: workspace.customerId,
			return_url: `${origin}${billingPath}`
		});
		return { ok: true, url: portal.url };
	} catch (err) {
		return { ok: false, message: stripeTrouble(err, 'opening the billing portal') };
	}
}
