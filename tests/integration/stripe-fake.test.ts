// The local Stripe fake (fakes/stripe) driven by the real `stripe` SDK, as the app will use it:
// customers, hosted checkout paid by form post, subscriptions, invoices, the billing portal, and
// webhooks verified with the SDK's constructEvent by a small stand-in for the app.
import { randomBytes } from 'node:crypto';
import { createServer, type IncomingMessage, type Server } from 'node:http';
import Stripe from 'stripe';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startStripeFake, type RunningFake } from '../support/fakes';

type Received = { event: Stripe.Event; raw: string; signature: string };
type Delivery = {
	event_id: string;
	type: string;
	resend: boolean;
	attempt: number;
	status: number | null;
	ok: boolean;
};

const APPROVED = '4242 4242 4242 4242';
const DECLINED = '4000 0000 0000 0002';
const PRICE = 'price_pincer_seat_monthly';

async function rawBody(req: IncomingMessage): Promise<string> {
	const chunks: Buffer[] = [];
	for await (const chunk of req) chunks.push(chunk as Buffer);
	return Buffer.concat(chunks).toString('utf8');
}

/** Stands in for the app: verifies each webhook and notes where checkout sent the browser. */
class Receiver {
	verified: Received[] = [];
	rejected: string[] = [];
	returns: URL[] = [];
	/** Answer this many webhook deliveries with 500 before accepting again. */
	failNext = 0;
	base = '';
	private server: Server | null = null;

	constructor(private readonly secret: string) {}

	async start(): Promise<void> {
		const server = createServer(async (req, res) => {
			const url = new URL(req.url ?? '/', this.base);
			if (req.method === 'POST' && url.pathname === '/api/v1/webhooks/stripe') {
				const raw = await rawBody(req);
				const signature = String(req.headers['stripe-signature'] ?? '');
				if (this.failNext > 0) {
					this.failNext--;
					res.writeHead(500).end('try again');
					return;
				}
				try {
					const event = Stripe.webhooks.constructEvent(raw, signature, this.secret);
					this.verified.push({ event, raw, signature });
					res.writeHead(200, { 'content-type': 'application/json' }).end('{"received":true}');
				} catch (err) {
					this.rejected.push(err instanceof Error ? err.message : String(err));
					res.writeHead(400).end('bad signature');
				}
				return;
			}
			if (req.method === 'GET' && url.pathname.startsWith('/billing/')) {
				this.returns.push(url);
				res.writeHead(200, { 'content-type': 'text/plain' }).end('back in Pincer');
				return;
			}
			res.writeHead(404).end();
		});
		await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
		const address = server.address();
		this.base = `http://127.0.0.1:${typeof address === 'object' && address ? address.port : 0}`;
		this.server = server;
	}

	get webhookUrl(): string {
		return `${this.base}/api/v1/webhooks/stripe`;
	}

	types(): string[] {
		return this.verified.map((r) => r.event.type);
	}

	clear(): void {
		this.verified = [];
		this.rejected = [];
		this.returns = [];
		this.failNext = 0;
	}

	async stop(): Promise<void> {
		const server = this.server;
		if (!server) return;
		await new Promise<void>((resolve) => {
			server.close(() => resolve());
			server.closeAllConnections();
		});
	}
}

describe('local Stripe fake', () => {
	const secret = `whsec_${randomBytes(24).toString('hex')}`;
	const receiver = new Receiver(secret);
	let fake: RunningFake;
	let stripe: Stripe;
	let api: string;

	const client = (key: string) =>
		new Stripe(key, {
			host: '127.0.0.1',
			port: Number(new URL(api).port),
			protocol: 'http',
			maxNetworkRetries: 0,
			telemetry: false
		});

	async function control<T = Record<string, unknown>>(
		path: string,
		init?: RequestInit
	): Promise<T> {
		const res = await fetch(`${api}/_fake${path}`, init);
		expect(res.ok, `${path} answered ${res.status}`).toBe(true);
		return (await res.json()) as T;
	}

	/** Waits until the fake has nothing left to deliver, then lists every delivery attempt. */
	async function deliveries(): Promise<Delivery[]> {
		return (await control<{ data: Delivery[] }>('/deliveries')).data;
	}

	async function createCheckout(
		seats: number,
		who: { customer: string } | { customer_email: string }
	): Promise<Stripe.Checkout.Session> {
		return stripe.checkout.sessions.create({
			mode: 'subscription',
			...who,
			line_items: [{ price: PRICE, quantity: seats }],
			client_reference_id: 'ws_quillwort',
			metadata: { workspace_id: 'ws_quillwort' },
			subscription_data: { metadata: { workspace_id: 'ws_quillwort' } },
			success_url: `${receiver.base}/billing/done?session_id={CHECKOUT_SESSION_ID}`,
			cancel_url: `${receiver.base}/billing/canceled`
		});
	}

	/** Fills in the hosted page's form the way a browser would, without following the redirect. */
	async function pay(session: Stripe.Checkout.Session, card: string): Promise<Response> {
		const page = await fetch(session.url!);
		expect(page.status).toBe(200);
		const html = await page.text();
		const action = /<form method="post" action="([^"]+)"/.exec(html)?.[1];
		expect(action).toBe(`/pay/${session.id}`);
		for (const name of ['card_number', 'expiry', 'cvc']) expect(html).toContain(`name="${name}"`);
		const form = new URLSearchParams({
			card_number: card,
			expiry: '12 / 34',
			cvc: '123',
			cardholder: 'Ines Quillwort'
		});
		if (html.includes('name="email"')) form.set('email', 'ines@quillwort.test');
		return fetch(new URL(action!, session.url!), {
			method: 'POST',
			body: form,
			redirect: 'manual'
		});
	}

	/** A customer with a paid subscription for `seats`; webhooks so far are cleared. */
	async function buySeats(seats: number) {
		const customer = await stripe.customers.create({
			email: 'ines@quillwort.test',
			metadata: { workspace_id: 'ws_quillwort' }
		});
		const session = await createCheckout(seats, { customer: customer.id });
		expect((await pay(session, APPROVED)).status).toBe(303);
		const done = await stripe.checkout.sessions.retrieve(session.id);
		const subscription = await stripe.subscriptions.retrieve(done.subscription as string);
		await deliveries();
		receiver.clear();
		return { customer, session, subscription };
	}

	beforeAll(async () => {
		await receiver.start();
		fake = await startStripeFake({ webhookUrl: receiver.webhookUrl, webhookSecret: secret });
		api = fake.urls.api;
		stripe = client('sk_test_pincer_local');
	});

	afterAll(async () => {
		await fake?.stop();
		await receiver.stop();
	});

	beforeEach(async () => {
		await control('/reset', { method: 'POST' });
		receiver.clear();
	});

	it('requires a test secret key and answers in Stripe-shaped errors', async () => {
		const anonymous = await fetch(`${api}/v1/customers/cus_nobody`);
		expect(anonymous.status).toBe(401);
		expect(await anonymous.json()).toMatchObject({ error: { type: 'invalid_request_error' } });
		await expect(client('sk_live_not_here').customers.create({})).rejects.toMatchObject({
			type: 'StripeAuthenticationError',
			statusCode: 401
		});

		await expect(stripe.customers.retrieve('cus_nobody')).rejects.toMatchObject({
			type: 'StripeInvalidRequestError',
			statusCode: 404,
			code: 'resource_missing',
			param: 'id'
		});
		await expect(
			stripe.checkout.sessions.create({
				mode: 'subscription',
				line_items: [{ price: 'price_nothing', quantity: 1 }],
				success_url: 'http://127.0.0.1/done'
			})
		).rejects.toMatchObject({
			statusCode: 400,
			code: 'resource_missing',
			param: 'line_items[0][price]'
		});
	});

	it('sells 5 seats through the hosted checkout and reports it with verified webhooks', async () => {
		const price = await stripe.prices.retrieve(PRICE);
		expect(price).toMatchObject({ object: 'price', unit_amount: 2900, currency: 'usd' });
		expect(price.recurring?.interval).toBe('month');

		const customer = await stripe.customers.create({
			email: 'ines@quillwort.test',
			name: 'Quillwort Studio',
			metadata: { workspace_id: 'ws_quillwort' }
		});
		expect(customer.id).toMatch(/^cus_/);
		expect(customer).toMatchObject({ object: 'customer', livemode: false });
		const renamed = await stripe.customers.update(customer.id, { name: 'Quillwort Studio Co' });
		expect(renamed.name).toBe('Quillwort Studio Co');
		expect(renamed.metadata).toEqual({ workspace_id: 'ws_quillwort' });
		expect(await stripe.customers.retrieve(customer.id)).toMatchObject({
			id: customer.id,
			email: 'ines@quillwort.test'
		});

		const session = await createCheckout(5, { customer: customer.id });
		expect(session.id).toMatch(/^cs_test_/);
		expect(session).toMatchObject({
			object: 'checkout.session',
			status: 'open',
			amount_total: 14500
		});
		expect(session.url).toBe(`${api}/pay/${session.id}`);

		const page = await fetch(session.url!);
		const html = await page.text();
		expect(page.headers.get('content-security-policy')).toContain("default-src 'none'");
		expect(html).toMatch(/id="seats">5</);
		expect(html).toContain('$29.00 / month');
		expect(html).toContain('$145.00');
		expect(html).toContain(`href="${receiver.base}/billing/canceled"`);
		expect(html).not.toMatch(/<script|<link|src="http/);

		const paid = await pay(session, APPROVED);
		expect(paid.status).toBe(303);
		const location = paid.headers.get('location')!;
		expect(location).toBe(`${receiver.base}/billing/done?session_id=${session.id}`);
		expect((await fetch(location)).status).toBe(200);
		expect(receiver.returns.map((u) => u.searchParams.get('session_id'))).toEqual([session.id]);

		const done = await stripe.checkout.sessions.retrieve(session.id, { expand: ['subscription'] });
		expect(done).toMatchObject({
			status: 'complete',
			payment_status: 'paid',
			customer: customer.id
		});
		const expanded = done.subscription as Stripe.Subscription;
		expect(expanded.object).toBe('subscription');

		const sub = await stripe.subscriptions.retrieve(expanded.id);
		expect(sub.id).toMatch(/^sub_/);
		expect(sub.status).toBe('active');
		expect(sub.customer).toBe(customer.id);
		expect(sub.metadata).toEqual({ workspace_id: 'ws_quillwort' });
		const item = sub.items.data[0];
		expect(item.id).toMatch(/^si_/);
		expect(item.quantity).toBe(5);
		expect(item.price.id).toBe(PRICE);
		const start = new Date(item.current_period_start * 1000);
		const end = new Date(item.current_period_end * 1000);
		expect(end.getUTCMonth()).toBe((start.getUTCMonth() + 1) % 12);
		expect((end.getTime() - start.getTime()) / 86_400_000).toBeGreaterThanOrEqual(28);

		const invoices = await stripe.invoices.list({ customer: customer.id, limit: 10 });
		expect(invoices).toMatchObject({ object: 'list', has_more: false, url: '/v1/invoices' });
		expect(invoices.data).toHaveLength(1);
		const invoice = invoices.data[0];
		expect(invoice.id).toBe(sub.latest_invoice);
		expect(invoice).toMatchObject({
			status: 'paid',
			amount_paid: 5 * 2900,
			total: 5 * 2900,
			billing_reason: 'subscription_create'
		});
		expect(invoice.parent?.subscription_details?.subscription).toBe(sub.id);
		expect(invoice.lines.data[0].quantity).toBe(5);

		expect(receiver.rejected).toEqual([]);
		expect(receiver.types()).toEqual([
			'checkout.session.completed',
			'customer.subscription.created',
			'invoice.paid'
		]);
		for (const { event } of receiver.verified) {
			expect(event.id).toMatch(/^evt_/);
			expect(event).toMatchObject({ object: 'event', livemode: false });
			expect(event.api_version).toBe(Stripe.API_VERSION);
		}
		const [completed, created, invoicePaid] = receiver.verified.map((r) => r.event.data.object);
		expect(completed).toMatchObject({
			id: session.id,
			status: 'complete',
			subscription: sub.id,
			customer: customer.id,
			client_reference_id: 'ws_quillwort',
			metadata: { workspace_id: 'ws_quillwort' }
		});
		expect((created as Stripe.Subscription).items.data[0].quantity).toBe(5);
		expect(invoicePaid).toMatchObject({ id: invoice.id, status: 'paid', amount_paid: 14500 });

		const attempts = await deliveries();
		expect(attempts.map((d) => [d.type, d.status])).toEqual([
			['checkout.session.completed', 200],
			['customer.subscription.created', 200],
			['invoice.paid', 200]
		]);
	});

	it('declines 4000 0000 0000 0002 without creating or sending anything', async () => {
		const session = await createCheckout(3, { customer_email: 'ops@ferngully.test' });
		const declined = await pay(session, DECLINED);
		expect(declined.status).toBe(402);
		expect(await declined.text()).toContain('Your card was declined');
		const unknown = await pay(session, '4111 1111 1111 1111');
		expect(await unknown.text()).toMatch(/unsupported test card/i);

		const after = await stripe.checkout.sessions.retrieve(session.id);
		expect(after).toMatchObject({ status: 'open', subscription: null, customer: null });
		const state = await control<Record<string, unknown[]>>('/state');
		expect(state.customers).toEqual([]);
		expect(state.subscriptions).toEqual([]);
		expect(state.invoices).toEqual([]);
		expect(await deliveries()).toEqual([]);
		expect((await control<{ data: unknown[] }>('/events')).data).toEqual([]);
		expect(receiver.verified).toEqual([]);

		// The same checkout still goes through with the approved card, making the customer.
		expect((await pay(session, APPROVED)).status).toBe(303);
		const done = await stripe.checkout.sessions.retrieve(session.id, { expand: ['customer'] });
		expect((done.customer as Stripe.Customer).email).toBe('ops@ferngully.test');
	});

	it('sends customer.subscription.updated when the seat count changes, then deleted on cancel', async () => {
		const { subscription } = await buySeats(5);
		const item = subscription.items.data[0];
		const updated = await stripe.subscriptions.update(subscription.id, {
			items: [{ id: item.id, quantity: 7 }],
			proration_behavior: 'create_prorations'
		});
		expect(updated.items.data[0].quantity).toBe(7);
		await deliveries();
		expect(receiver.types()).toEqual(['customer.subscription.updated']);
		const event = receiver.verified[0].event;
		expect((event.data.object as Stripe.Subscription).items.data[0].quantity).toBe(7);
		expect(event.data.previous_attributes).toMatchObject({ items: { data: [{ quantity: 5 }] } });
		expect(event.request?.id).toMatch(/^req_/);
		expect((await stripe.subscriptions.retrieve(subscription.id)).items.data[0].quantity).toBe(7);

		const canceled = await stripe.subscriptions.cancel(subscription.id);
		expect(canceled.status).toBe('canceled');
		await deliveries();
		expect(receiver.types()).toEqual([
			'customer.subscription.updated',
			'customer.subscription.deleted'
		]);
		await expect(stripe.subscriptions.cancel(subscription.id)).rejects.toMatchObject({
			statusCode: 404
		});
	});

	it('bills added seats at once with always_invoice', async () => {
		const { customer, subscription } = await buySeats(2);
		await stripe.subscriptions.update(subscription.id, {
			items: [{ id: subscription.items.data[0].id, quantity: 4 }],
			proration_behavior: 'always_invoice'
		});
		await deliveries();
		expect(receiver.types()).toEqual(['customer.subscription.updated', 'invoice.paid']);
		const [latest] = (await stripe.invoices.list({ customer: customer.id, limit: 1 })).data;
		expect(latest.billing_reason).toBe('subscription_update');
		expect(latest.amount_paid).toBeGreaterThan(0);
		expect(latest.amount_paid).toBeLessThanOrEqual(2 * 2900);
	});

	it('rejects a webhook whose signature does not match the shared secret', async () => {
		const { subscription } = await buySeats(2);
		await stripe.subscriptions.cancel(subscription.id);
		await deliveries();
		const { raw, signature } = receiver.verified[0];
		expect(raw).toContain('"livemode": false');

		const forged = Stripe.webhooks.generateTestHeaderString({
			payload: raw,
			secret: 'whsec_someone_else'
		});
		expect(() => Stripe.webhooks.constructEvent(raw, forged, secret)).toThrow(
			Stripe.errors.StripeSignatureVerificationError
		);
		const tampered = raw.replace('"livemode": false', '"livemode": true');
		expect(() => Stripe.webhooks.constructEvent(tampered, signature, secret)).toThrow(
			Stripe.errors.StripeSignatureVerificationError
		);

		const res = await fetch(receiver.webhookUrl, {
			method: 'POST',
			headers: { 'content-type': 'application/json', 'stripe-signature': forged },
			body: raw
		});
		expect(res.status).toBe(400);
		expect(receiver.rejected).toHaveLength(1);
		expect(receiver.verified).toHaveLength(1);
	});

	it('resends an event with the same id', async () => {
		const customer = await stripe.customers.create({ email: 'ines@quillwort.test' });
		const session = await createCheckout(3, { customer: customer.id });
		await pay(session, APPROVED);
		const first = receiver.verified.find((r) => r.event.type === 'checkout.session.completed')!;
		const result = await control<{ attempts: Delivery[] }>(`/events/${first.event.id}/resend`, {
			method: 'POST'
		});
		expect(result.attempts.map((a) => [a.status, a.resend])).toEqual([[200, true]]);
		const copies = receiver.verified.filter((r) => r.event.id === first.event.id);
		expect(copies).toHaveLength(2);
		expect(copies[1].event).toEqual(copies[0].event);
		expect((await deliveries()).filter((d) => d.event_id === first.event.id)).toHaveLength(2);
	});

	it('retries a failed delivery with the same event', async () => {
		const { subscription } = await buySeats(1);
		receiver.failNext = 2;
		await stripe.subscriptions.update(subscription.id, {
			items: [{ id: subscription.items.data[0].id, quantity: 2 }]
		});
		const attempts = (await deliveries()).filter((d) => d.type === 'customer.subscription.updated');
		expect(attempts.map((d) => [d.attempt, d.status])).toEqual([
			[1, 500],
			[2, 500],
			[3, 200]
		]);
		expect(new Set(attempts.map((d) => d.event_id)).size).toBe(1);
		expect(receiver.types()).toEqual(['customer.subscription.updated']);
	});

	it('fails a renewal (past_due) and cancels as Stripe would', async () => {
		const { customer, subscription } = await buySeats(4);
		const renewal = await control<{
			subscription: Stripe.Subscription;
			invoice: Stripe.Invoice;
		}>(`/subscriptions/${subscription.id}/fail-renewal`, { method: 'POST' });
		expect(renewal.subscription.status).toBe('past_due');
		expect(renewal.invoice).toMatchObject({ status: 'open', amount_due: 4 * 2900, amount_paid: 0 });
		expect(receiver.types()).toEqual(['invoice.payment_failed', 'customer.subscription.updated']);
		const updated = receiver.verified[1].event;
		expect(updated.data.object).toMatchObject({ id: subscription.id, status: 'past_due' });
		expect(updated.data.previous_attributes).toMatchObject({ status: 'active' });
		expect((await stripe.subscriptions.retrieve(subscription.id)).status).toBe('past_due');
		const invoices = await stripe.invoices.list({ customer: customer.id, limit: 10 });
		expect(invoices.data.map((i) => i.status)).toEqual(['open', 'paid']);

		await control(`/subscriptions/${subscription.id}/cancel`, {
			method: 'POST',
			headers: { 'content-type': 'application/json' },
			body: JSON.stringify({ reason: 'payment_failed' })
		});
		expect(receiver.types().at(-1)).toBe('customer.subscription.deleted');
		expect(receiver.verified.at(-1)?.event.data.object).toMatchObject({
			status: 'canceled',
			cancellation_details: { reason: 'payment_failed' }
		});
	});

	it('lets the billing portal change seats and cancel', async () => {
		const { customer, subscription } = await buySeats(2);
		const portal = await stripe.billingPortal.sessions.create({
			customer: customer.id,
			return_url: `${receiver.base}/billing/settings`
		});
		expect(portal.id).toMatch(/^bps_/);
		expect(portal.url).toBe(`${api}/portal/${portal.id}`);

		const html = await (await fetch(portal.url)).text();
		expect(html).toContain(`href="${receiver.base}/billing/settings"`);
		const seatsAction = /action="([^"]+\/seats)"/.exec(html)?.[1];
		const cancelAction = /action="([^"]+\/cancel)"/.exec(html)?.[1];
		expect(seatsAction).toBeDefined();
		expect(cancelAction).toBeDefined();

		const changed = await fetch(new URL(seatsAction!, api), {
			method: 'POST',
			body: new URLSearchParams({ quantity: '6' }),
			redirect: 'manual'
		});
		expect(changed.status).toBe(303);
		expect(receiver.types()).toEqual(['customer.subscription.updated']);
		expect((await stripe.subscriptions.retrieve(subscription.id)).items.data[0].quantity).toBe(6);

		const canceled = await fetch(new URL(cancelAction!, api), {
			method: 'POST',
			redirect: 'manual'
		});
		expect(canceled.status).toBe(303);
		expect(receiver.types()).toEqual([
			'customer.subscription.updated',
			'customer.subscription.deleted'
		]);
		expect((await stripe.subscriptions.retrieve(subscription.id)).status).toBe('canceled');
	});
});
