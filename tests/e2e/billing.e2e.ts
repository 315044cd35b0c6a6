import { randomUUID } from 'node:crypto';
import type { Browser } from 'playwright-core';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchBrowser } from '../support/browser';
import { requireEnv } from '../support/db';
import {
	APPROVED_CARD,
	BillingPage,
	CheckoutPage,
	DECLINED_CARD,
	SignUpPage,
	stripeControl,
	type Founder
} from './pages/billing';
import { demo, postForm, signedIn } from './pages/session';

describe('seats and billing through the local Stripe', () => {
	let browser: Browser;
	let sql: postgres.Sql;
	beforeAll(async () => {
		browser = await launchBrowser();
		sql = postgres(requireEnv('PINCER_E2E_DATABASE_URL'), { max: 2, onnotice: () => {} });
	});
	afterAll(async () => {
		await browser?.close();
		await sql?.end();
	});

	const founder = (seats: number): Founder => {
		const tag = randomUUID().slice(0, 8);
		return {
			name: 'Imogen Tarrant',
			email: `founder-${tag}@example.test`,
			workspace: `Harrowgate Lending ${tag}`,
			password: 'a-sound-password-2026',
			seats
		};
	};

	async function workspaceOf(email: string) {
		const [row] = await sql`
			select w.id, w.seats, w.subscription_status, w.stripe_subscription_id,
				w.stripe_customer_id, w.current_period_end
			from workspaces w
			join memberships m on m.workspace_id = w.id
			join users u on u.id = m.user_id
			where u.email = ${email}`;
		return row;
	}

	async function auditActions(workspaceId: string) {
		const rows = await sql`
			select action from audit_events where workspace_id = ${workspaceId} order by id`;
		return rows.map((r) => r.action as string);
	}

	/** Signs up, pays with the approved card and lands on the billing page. */
	async function subscribed(seats: number) {
		const who = founder(seats);
		const context = await browser.newContext();
		const page = await context.newPage();
		await new SignUpPage(page).create(who);
		const checkout = new CheckoutPage(page);
		await checkout.arrive();
		await checkout.pay(APPROVED_CARD);
		const billing = new BillingPage(page);
		await billing.arriveFromCheckout();
		return { who, context, page, billing };
	}

	it('signs up, pays on the hosted checkout and comes back with the seats active', async () => {
		const who = founder(5);
		const context = await browser.newContext();
		const page = await context.newPage();
		await new SignUpPage(page).create(who);
		const checkout = new CheckoutPage(page);
		await checkout.arrive();
		await expect(checkout.seats()).resolves.toBe('5');
		const before = await workspaceOf(who.email);
		expect(before.subscription_status).toBe('trialing');
		expect(before.seats).toBe(3);

		await checkout.pay(APPROVED_CARD);
		const billing = new BillingPage(page);
		await billing.arriveFromCheckout();
		await page.getByTestId('checkout-confirmed').waitFor();
		await expect(billing.status()).resolves.toBe('Active');
		await expect(billing.seatsPaid()).resolves.toBe('5');
		await expect(page.getByTestId('invoice-row').count()).resolves.toBe(1);
		await expect(page.getByTestId('invoices').textContent()).resolves.toContain('$145.00');

		const after = await workspaceOf(who.email);
		expect(after.subscription_status).toBe('active');
		expect(after.seats).toBe(5);
		expect(after.stripe_subscription_id).toMatch(/^sub_/);
		expect(after.current_period_end).not.toBeNull();
		expect(await auditActions(after.id)).toEqual(
			expect.arrayContaining([
				'billing.checkout.start',
				'billing.checkout.complete',
				'billing.subscription.create',
				'billing.invoice.paid'
			])
		);
		await context.close();
	});

	it('leaves the workspace unpaid, saying so, when the card is declined', async () => {
		const who = founder(4);
		const context = await browser.newContext();
		const page = await context.newPage();
		await new SignUpPage(page).create(who);
		const checkout = new CheckoutPage(page);
		await checkout.arrive();
		await checkout.pay(DECLINED_CARD);
		await expect(checkout.alert()).resolves.toContain('Your card was declined');

		const row = await workspaceOf(who.email);
		expect(row.subscription_status).toBe('trialing');
		expect(row.stripe_subscription_id).toBeNull();
		expect(row.seats).toBe(3);

		await checkout.leave();
		const billing = new BillingPage(page);
		await expect(page.getByTestId('checkout-left').textContent()).resolves.toMatch(
			/nothing was charged and the workspace is still unpaid/
		);
		await expect(billing.status()).resolves.toBe('Trial');
		await expect(billing.seatsPaid()).resolves.toBe('3');
		await context.close();
	});

	it("changes the seat count and shows it once Stripe's webhook confirms it", async () => {
		const { who, context, page, billing } = await subscribed(5);
		await billing.waitForSeatsPaid(5);
		await billing.changeSeats(7);
		await page.getByText('Stripe now bills 7 seats').waitFor();
		await billing.waitForSeatsPaid(7);

		const row = await workspaceOf(who.email);
		expect(row.seats).toBe(7);
		const [update] = await sql`
			select payload from audit_events
			where workspace_id = ${row.id} and action = 'billing.subscription.update'
			order by id desc limit 1`;
		expect(update.payload.changes.seats).toEqual({ from: 5, to: 7 });
		await context.close();
	});

	it('warns admins of a failed renewal, then turns read-only when Stripe cancels', async () => {
		const { who, context, page, billing } = await subscribed(3);
		await billing.waitForSeatsPaid(3);
		const { stripe_subscription_id: subscription, id } = await workspaceOf(who.email);

		await stripeControl(`/subscriptions/${subscription}/fail-renewal`);
		await page.goto(`${inject('baseURL')}/app`);
		await expect(page.getByTestId('past-due-banner').textContent()).resolves.toContain(
			'last payment for this workspace failed'
		);
		await billing.open();
		await expect(billing.status()).resolves.toBe('Payment overdue');

		await stripeControl(`/subscriptions/${subscription}/cancel`, { reason: 'payment_failed' });
		await page.goto(`${inject('baseURL')}/app`);
		await expect(page.getByTestId('read-only-banner').textContent()).resolves.toContain(
			'is read-only'
		);
		const [{ before }] =
			await sql`select count(*)::int as before from invitations where workspace_id = ${id}`;
		const refused = await postForm(context, '/app/settings/team?/invite', {
			email: `late-${randomUUID().slice(0, 6)}@example.test`,
			role: 'analyst'
		});
		expect(refused.status()).toBe(403);
		expect(await refused.text()).toContain('read-only because its subscription is canceled');
		const [{ after }] =
			await sql`select count(*)::int as after from invitations where workspace_id = ${id}`;
		expect(after).toBe(before);

		const read = await page.goto(`${inject('baseURL')}/app/loans`);
		expect(read?.status()).toBe(200);
		const exported = await context.request.get(`${inject('baseURL')}/app/audit/export?format=csv`);
		expect(exported.status()).toBe(200);
		expect(await exported.text()).toContain('billing.subscription.cancel');
		// Paying again is the one write still open.
		const again = await postForm(context, '/app/settings/billing?/subscribe', { seats: '3' });
		expect(again.status()).toBe(303);
		expect(again.headers().location).toMatch(/^\/app\/settings\/billing\?pay=cs_/);
		await context.close();
	});

	it('shows billing to admins only', async () => {
		const { context, page } = await signedIn(browser, demo('officer'));
		const nav = await page.getByRole('navigation', { name: 'Main' }).textContent();
		expect(nav).not.toContain('Billing');
		const response = await page.goto(`${inject('baseURL')}/app/settings/billing`);
		expect(response?.status()).toBe(403);
		await context.close();

		const admin = await signedIn(browser, demo('admin'));
		await expect(
			admin.page.getByRole('navigation', { name: 'Main' }).textContent()
		).resolves.toContain('Billing and seats');
		const billing = new BillingPage(admin.page);
		expect((await billing.open())?.status()).toBe(200);
		await expect(billing.status()).resolves.toBe('Active');
		await admin.context.close();
	});
});
