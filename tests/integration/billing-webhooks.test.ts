// The Stripe webhook endpoint against the real database: signatures, once-only processing and
// the audit row, plus the seat floor of a subscribed workspace. Events are signed here with the
// SDK's own test-header helper and the secret the app is configured with.
import { randomBytes, randomUUID } from 'node:crypto';
import type { RequestEvent } from '@sveltejs/kit';
import { and, count, eq, sql } from 'drizzle-orm';
import Stripe from 'stripe';
import { describe, expect, it } from 'vitest';
import { env } from '$env/dynamic/private';
import { changeSeats } from '$lib/server/billing';
import { db } from '$lib/server/db';
import { auditEvents, webhookEvents, workspaces } from '$lib/server/db/schema';
import { invite } from '$lib/server/workspaces/members';
import { POST } from '../../src/routes/api/v1/webhooks/stripe/+server';
import { makeMember, makeWorkspace } from '../support/fixtures';

const PERIOD_END = Math.floor(Date.UTC(2031, 0, 15) / 1000);

function subscriptionEvent(
	type: 'customer.subscription.created' | 'customer.subscription.updated',
	workspaceId: string,
	seats: number,
	id = `evt_${randomBytes(12).toString('hex')}`
) {
	return {
		id,
		object: 'event',
		type,
		created: Math.floor(Date.now() / 1000),
		livemode: false,
		data: {
			object: {
				id: `sub_${workspaceId.slice(0, 8)}`,
				object: 'subscription',
				status: 'active',
				customer: `cus_${workspaceId.slice(0, 8)}`,
				metadata: { workspace_id: workspaceId },
				items: {
					object: 'list',
					data: [
						{
							id: 'si_seats',
							quantity: seats,
							current_period_end: PERIOD_END,
							price: { id: 'price_pincer_seat_monthly' }
						}
					]
				}
			}
		}
	};
}

/** Posts a body to the endpoint as Stripe would, signed with `secret` unless told otherwise. */
async function deliver(body: string, signature: string | null) {
	const headers = new Headers({ 'content-type': 'application/json' });
	if (signature !== null) headers.set('stripe-signature', signature);
	const request = new Request('http://127.0.0.1/api/v1/webhooks/stripe', {
		method: 'POST',
		headers,
		body
	});
	return POST({ request } as RequestEvent as Parameters<typeof POST>[0]);
}

const sign = (payload: string, secret = env.STRIPE_WEBHOOK_SECRET!) =>
	Stripe.webhooks.generateTestHeaderString({ payload, secret });

async function billingOf(workspaceId: string) {
	const [row] = await db
		.select({
			seats: workspaces.seats,
			status: workspaces.subscriptionStatus,
			subscriptionId: workspaces.stripeSubscriptionId
		})
		.from(workspaces)
		.where(eq(workspaces.id, workspaceId));
	return row;
}

async function auditCount(workspaceId: string, eventId?: string) {
	const [{ n }] = await db
		.select({ n: count() })
		.from(auditEvents)
		.where(
			and(
				eq(auditEvents.workspaceId, workspaceId),
				eventId ? sql`${auditEvents.payload}->>'stripeEvent' = ${eventId}` : undefined
			)
		);
	return n;
}

describe('Stripe webhooks', () => {
	it('has a webhook secret to verify with', () => {
		expect(env.STRIPE_WEBHOOK_SECRET).toMatch(/^whsec_/);
	});

	it('answers an unverifiable delivery with 400 and changes nothing', async () => {
		const workspace = await makeWorkspace(3);
		const event = subscriptionEvent('customer.subscription.created', workspace.id, 9);
		const payload = JSON.stringify(event);
		const tampered = payload.replace('"quantity":9', '"quantity":90');
		const attempts = [
			deliver(payload, sign(payload, `whsec_${randomBytes(24).toString('hex')}`)),
			deliver(tampered, sign(payload)),
			deliver(payload, null),
			deliver(payload, 't=1,v1=deadbeef')
		];
		for (const response of await Promise.all(attempts)) {
			expect(response.status).toBe(400);
			expect((await response.json()).error.code).toBe('bad_signature');
		}
		expect(await billingOf(workspace.id)).toEqual({
			seats: 3,
			status: 'trialing',
			subscriptionId: null
		});
		const stored = await db.select().from(webhookEvents).where(eq(webhookEvents.id, event.id));
		expect(stored).toEqual([]);
		expect(await auditCount(workspace.id)).toBe(0);
	});

	it('applies a verified event to its workspace with one audit row', async () => {
		const workspace = await makeWorkspace(3);
		const payload = JSON.stringify(
			subscriptionEvent('customer.subscription.created', workspace.id, 6)
		);
		const response = await deliver(payload, sign(payload));
		expect(response.status).toBe(200);
		expect(await response.json()).toEqual({ received: true, outcome: 'applied' });
		expect(await billingOf(workspace.id)).toEqual({
			seats: 6,
			status: 'active',
			subscriptionId: `sub_${workspace.id.slice(0, 8)}`
		});
		const [audit] = await db
			.select({ action: auditEvents.action, payload: auditEvents.payload })
			.from(auditEvents)
			.where(eq(auditEvents.workspaceId, workspace.id));
		expect(audit.action).toBe('billing.subscription.create');
		expect(audit.payload).toMatchObject({
			changes: { seats: { from: 3, to: 6 }, subscriptionStatus: { from: 'trialing', to: 'active' } }
		});
	});

	it('processes the same event id once, however often and however close together it arrives', async () => {
		const workspace = await makeWorkspace(3);
		const first = JSON.stringify(
			subscriptionEvent('customer.subscription.created', workspace.id, 6)
		);
		const firstId = JSON.parse(first).id as string;
		const twice = await Promise.all([deliver(first, sign(first)), deliver(first, sign(first))]);
		expect(twice.map((r) => r.status)).toEqual([200, 200]);
		const outcomes = await Promise.all(twice.map(async (r) => (await r.json()).outcome));
		expect(outcomes.sort()).toEqual(['applied', 'duplicate']);

		// A later change, then the first event once more: re-applying it would undo the change.
		const later = JSON.stringify(
			subscriptionEvent('customer.subscription.updated', workspace.id, 8)
		);
		expect((await deliver(later, sign(later))).status).toBe(200);
		const again = await deliver(first, sign(first));
		expect(await again.json()).toEqual({ received: true, outcome: 'duplicate' });

		expect((await billingOf(workspace.id)).seats).toBe(8);
		expect(await auditCount(workspace.id, firstId)).toBe(1);
		expect(await auditCount(workspace.id)).toBe(2);
		const [stored] = await db.select().from(webhookEvents).where(eq(webhookEvents.id, firstId));
		expect(stored).toMatchObject({
			type: 'customer.subscription.created',
			workspaceId: workspace.id
		});
	});

	it('acknowledges an event for no known workspace without changing anything', async () => {
		const payload = JSON.stringify(
			subscriptionEvent('customer.subscription.updated', randomUUID(), 4)
		);
		const response = await deliver(payload, sign(payload));
		expect(await response.json()).toEqual({ received: true, outcome: 'ignored' });
	});
});

describe('seat changes', () => {
	it('refuses fewer seats than members and open invitations, with the count, changing nothing', async () => {
		const workspace = await makeWorkspace(5);
		await db
			.update(workspaces)
			.set({ subscriptionStatus: 'active', stripeSubscriptionId: 'sub_never_called' })
			.where(eq(workspaces.id, workspace.id));
		const { user: admin } = await makeMember(workspace.id, 'admin');
		await makeMember(workspace.id, 'officer');
		await makeMember(workspace.id, 'reviewer');
		const acting = { workspaceId: workspace.id, actorId: admin.id };
		const invited = await invite(acting, {
			email: `pending-${workspace.id.slice(0, 6)}@example.test`,
			role: 'analyst'
		});
		expect(invited.ok).toBe(true);
		const auditBefore = await auditCount(workspace.id);

		const refused = await changeSeats(acting, 3);
		expect(refused).toEqual({
			ok: false,
			message: expect.stringContaining(
				'4 seats are in use (3 members and 1 open invitation), so the workspace needs at least 4'
			)
		});
		expect(refused.ok || refused.message).toContain('Settings → Team');
		expect((await billingOf(workspace.id)).seats).toBe(5);
		expect(await auditCount(workspace.id)).toBe(auditBefore);
	});
});
