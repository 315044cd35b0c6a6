// The guard's read-only rule: in a workspace whose subscription ended (or whose trial ran out
// unpaid) every write through requireRole is refused, while reads, billing and the audit-chain
// check still pass.
import { isHttpError, type RequestEvent } from '@sveltejs/kit';
import { describe, expect, it } from 'vitest';
import { requireRole, type Actor } from '$lib/server/auth';

function actorIn(subscriptionStatus: string, trialEndsAt: Date | null = null): Actor {
	const workspace = {
		membershipId: 'm1',
		id: '00000000-0000-4000-8000-000000000001',
		name: 'Quillwort Savings',
		slug: 'quillwort',
		seats: 3,
		subscriptionStatus,
		trialEndsAt,
		role: 'admin' as const
	};
	return {
		user: { id: 'u1', email: 'admin@quillwort.example', name: 'Admin' },
		workspaces: [workspace],
		workspace
	};
}

/** A request to `routeId` (with `?/action` when posting a form action) made by `actor`. */
function request(actor: Actor, method: string, routeId: string, search = '') {
	return {
		request: new Request(`http://127.0.0.1/page${search}`, { method }),
		url: new URL(`http://127.0.0.1/page${search}`),
		route: { id: routeId },
		locals: { actor: Promise.resolve(actor) }
	} as unknown as RequestEvent;
}

async function refusal(event: RequestEvent): Promise<string | null> {
	try {
		await requireRole(event);
		return null;
	} catch (err) {
		if (isHttpError(err) && err.status === 403) return err.body.message;
		throw err;
	}
}

describe('read-only workspaces', () => {
	const canceled = actorIn('canceled');

	it('refuses a write with the reason and what still works', async () => {
		const message = await refusal(
			request(canceled, 'POST', '/(app)/app/settings/team', '?/invite')
		);
		expect(message).toContain(
			'Quillwort Savings is read-only because its subscription is canceled'
		);
		expect(message).toContain('readable and exportable');
		expect(
			await refusal(request(canceled, 'POST', '/(app)/app/loans/new', '?/terms'))
		).not.toBeNull();
	});

	it('still lets it read, export, pay and check the audit chain', async () => {
		expect(await refusal(request(canceled, 'GET', '/(app)/app/loans'))).toBeNull();
		expect(await refusal(request(canceled, 'GET', '/(app)/app/audit/export'))).toBeNull();
		expect(
			await refusal(request(canceled, 'POST', '/(app)/app/settings/billing', '?/subscribe'))
		).toBeNull();
		expect(await refusal(request(canceled, 'POST', '/(app)/app/audit', '?/check'))).toBeNull();
	});

	it('lets paying, overdue and trial workspaces write; an expired trial may not', async () => {
		const invite = (actor: Actor) =>
			refusal(request(actor, 'POST', '/(app)/app/settings/team', '?/invite'));
		expect(await invite(actorIn('active'))).toBeNull();
		expect(await invite(actorIn('past_due'))).toBeNull();
		expect(await invite(actorIn('trialing', new Date(Date.now() + 86_400_000)))).toBeNull();
		expect(await invite(actorIn('trialing', new Date(Date.now() - 1000)))).toContain(
			'free trial has ended'
		);
	});
});
