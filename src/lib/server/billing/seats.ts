// Changing the number of paid seats of a subscribed workspace. Stripe is the record of what is
// paid: the new count reaches the workspace through the subscription.updated webhook.
import { eq } from 'drizzle-orm';
import { appendAuditEvent } from '../audit/chain';
import { db } from '../db';
import { workspaces } from '../db/schema';
import { seatUse } from '../workspaces/members';
import { seatPriceId, stripe, stripeTrouble } from './client';
import { PAYING } from './status';

export type Acting = { workspaceId: string; actorId: string };
export type Refusal = { ok: false; message: string };

/** Members plus open invitations: the fewest seats the workspace can pay for. */
export function seatsInUse(use: { members: number; pending: number }): number {
	return use.members + use.pending;
}

/** Why `seats` is too few for the people already in the workspace, or null. */
export function belowUseMessage(use: { members: number; pending: number }, seats: number) {
	const inUse = seatsInUse(use);
	if (seats >= inUse) return null;
	const people =
		use.pending > 0
			? `${use.members} ${use.members === 1 ? 'member' : 'members'} and ${use.pending} open ${use.pending === 1 ? 'invitation' : 'invitations'}`
			: `${use.members} ${use.members === 1 ? 'member' : 'members'}`;
	return `${inUse} seats are in use (${people}), so the workspace needs at least ${inUse}. Remove members or withdraw invitations under Settings → Team first.`;
}

/**
 * Asks Stripe to bill `seats` seats from now on (added seats are invoiced for the rest of the
 * period). The workspace row stays locked during the call, so no invitation slips in between.
 */
export async function changeSeats(
	acting: Acting,
	seats: number
): Promise<{ ok: true; seats: number; unchanged: boolean } | Refusal> {
	try {
		return await db.transaction(async (tx) => {
			const use = await seatUse(tx, acting.workspaceId);
			const [workspace] = await tx
				.select({
					seats: workspaces.seats,
					status: workspaces.subscriptionStatus,
					subscriptionId: workspaces.stripeSubscriptionId
				})
				.from(workspaces)
				.where(eq(workspaces.id, acting.workspaceId));
			if (!workspace.subscriptionId || !PAYING.has(workspace.status)) {
				return {
					ok: false as const,
					message:
						'This workspace has no running subscription: subscribe first, with the seats you need.'
				};
			}
			const tooFew = belowUseMessage(use, seats);
			if (tooFew) return { ok: false as const, message: tooFew };
			if (seats === workspace.seats) return { ok: true as const, seats, unchanged: true };

			const subscription = await stripe().subscriptions.retrieve(workspace.subscriptionId);
			const items = subscription.items.data;
			const item = items.find((i) => i.price.id === seatPriceId()) ?? items[0];
			await stripe().subscriptions.update(workspace.subscriptionId, {
				items: [{ id: item.id, quantity: seats }],
				proration_behavior: 'always_invoice'
			});
			await appendAuditEvent(tx, {
				workspaceId: acting.workspaceId,
				actorId: acting.actorId,
				action: 'billing.seats.request',
				subject: `workspace:${acting.workspaceId}`,
				payload: { from: workspace.seats, to: seats, subscription: workspace.subscriptionId }
			});
			return { ok: true as const, seats, unchanged: false };
		});
	} catch (err) {
		return { ok: false, message: stripeTrouble(err, 'the seat change') };
	}
}
