// Subscription states as Pincer reads them (Stripe's words plus our own trial) and what each
// allows. Pure: the guards, the layout banner and the billing page all ask here.

/** A workspace's standing: the columns of `workspaces` these rules read. */
export type Standing = { name: string; subscriptionStatus: string; trialEndsAt: Date | null };

/** States in which a Stripe subscription is being paid (or retried) and the team keeps working. */
export const PAYING = new Set(['active', 'past_due']);

/** States after which the workspace turns read-only until someone subscribes again. */
const ENDED = new Set(['canceled', 'unpaid', 'incomplete_expired', 'paused']);

export const statusLabels: Record<string, string> = {
	trialing: 'Trial',
	active: 'Active',
	past_due: 'Payment overdue',
	canceled: 'Canceled',
	unpaid: 'Unpaid',
	incomplete: 'Awaiting first payment',
	incomplete_expired: 'First payment failed',
	paused: 'Paused'
};

export function statusLabel(status: string): string {
	return statusLabels[status] ?? status;
}

export type ReadOnlyReason = 'ended' | 'trial-over';

/** Why the workspace may only be read (its subscription ended, or its trial ran out unpaid), or null. */
export function readOnlyReason(standing: Standing, now = new Date()): ReadOnlyReason | null {
	if (ENDED.has(standing.subscriptionStatus)) return 'ended';
	if (
		standing.subscriptionStatus === 'trialing' &&
		standing.trialEndsAt !== null &&
		standing.trialEndsAt.getTime() <= now.getTime()
	) {
		return 'trial-over';
	}
	return null;
}

const WHERE = 'an admin can subscribe again under Settings → Billing and seats';

/** The sentence shown when a write is refused and in the banner of a read-only workspace. */
export function readOnlyMessage(standing: Standing, reason: ReadOnlyReason): string {
	const why =
		reason === 'trial-over'
			? 'its free trial has ended without a subscription'
			: `its subscription is ${statusLabel(standing.subscriptionStatus).toLowerCase()}`;
	return `${standing.name} is read-only because ${why}. Everything stays readable and exportable; ${WHERE}.`;
}
