// The REST API under /v1: the calls Pincer makes through the `stripe` SDK, with Stripe's
// conventions (bearer test key, bracket-notation parameters, expand, lists, idempotency keys,
// Stripe-shaped errors).
import type { IncomingMessage, ServerResponse } from 'node:http';
import {
	cancelSubscription,
	createCustomer,
	updateSubscription,
	type SubscriptionChange
} from './billing.ts';
import { config } from './config.ts';
import {
	optArray,
	optBoolean,
	optInteger,
	optNullableString,
	optObject,
	optString,
	paramNames,
	parseParams,
	readExpand,
	readMetadata,
	reqString,
	type Params
} from './form.ts';
import { ApiError, invalid, noSuch, readBody, sendJson } from './http.ts';
import {
	expand,
	list,
	renderCheckoutLines,
	renderCustomer,
	renderInvoice,
	renderPortalSession,
	renderPrice,
	renderProduct,
	renderSession,
	renderSubscription,
	type Json
} from './objects.ts';
import { newId, now, store, type CheckoutLine, type Subscription } from './store.ts';
import type { EventRequest } from './webhooks.ts';

type Context = { params: Params; request: EventRequest };
type Handler = (ctx: Context, id: string) => Json;
type Route = { method: string; pattern: RegExp; known: string[]; handle: Handler };

const EMAIL = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

function email(p: Params, name: string): string | null | undefined {
	const value = optNullableString(p, name);
	if (value && !EMAIL.test(value))
		throw invalid(`Invalid email address: ${value}`, name, 'email_invalid');
	return value;
}

function url(p: Params, name: string): string | null {
	const value = optString(p, name);
	if (value === undefined || value === '') return null;
	let parsed: URL;
	try {
		parsed = new URL(value);
	} catch {
		throw invalid(`Not a valid URL: ${name}`, name, 'url_invalid');
	}
	if (parsed.protocol !== 'http:' && parsed.protocol !== 'https:') {
		throw invalid(`Not a valid URL: ${name} must use http or https`, name, 'url_invalid');
	}
	return value;
}

function customerOf(id: string, param?: string) {
	const customer = store.customers.get(id);
	if (!customer) throw noSuch('customer', id, param);
	return customer;
}

function subscriptionOf(id: string): Subscription {
	const subscription = store.subscriptions.get(id);
	if (!subscription) throw noSuch('subscription', id);
	return subscription;
}

/** Newest-first pagination with limit, starting_after and ending_before. */
function page<T extends { id: string }>(
	items: T[],
	p: Params,
	path: string,
	render: (item: T) => Json
): Json {
	const limit = optInteger(p, 'limit', { min: 1, max: 100 }) ?? 10;
	let start = 0;
	let end = items.length;
	const after = optString(p, 'starting_after');
	const before = optString(p, 'ending_before');
	if (after) {
		const index = items.findIndex((i) => i.id === after);
		if (index < 0) throw noSuch('object', after, 'starting_after');
		start = index + 1;
	}
	if (before) {
		const index = items.findIndex((i) => i.id === before);
		if (index < 0) throw noSuch('object', before, 'ending_before');
		end = index;
		start = Math.max(start, end - limit);
	}
	const slice = items.slice(start, Math.min(end, start + limit));
	return list(slice.map(render), path, before ? start > 0 : start + slice.length < end);
}

// ── customers ────────────────────────────────────────────────────────────────────────────────

const CUSTOMER_FIELDS = ['email', 'name', 'phone', 'description', 'metadata', 'expand'];

function createCustomerRoute({ params: p }: Context): Json {
	const customer = createCustomer({
		email: email(p, 'email'),
		name: optNullableString(p, 'name'),
		phone: optNullableString(p, 'phone'),
		description: optNullableString(p, 'description'),
		metadata: readMetadata(p, 'metadata')
	});
	return renderCustomer(customer);
}

function updateCustomerRoute({ params: p }: Context, id: string): Json {
	const customer = customerOf(id);
	const mail = email(p, 'email');
	const name = optNullableString(p, 'name');
	const phone = optNullableString(p, 'phone');
	const description = optNullableString(p, 'description');
	const metadata = readMetadata(p, 'metadata', customer.metadata);
	if (mail !== undefined) customer.email = mail;
	if (name !== undefined) customer.name = name;
	if (phone !== undefined) customer.phone = phone;
	if (description !== undefined) customer.description = description;
	if (metadata) customer.metadata = metadata;
	return renderCustomer(customer);
}

// ── checkout sessions ────────────────────────────────────────────────────────────────────────

function readLineItems(p: Params): CheckoutLine[] {
	const items = optArray(p, 'line_items');
	if (!items || items.length === 0) {
		throw invalid('Missing required param: line_items.', 'line_items', 'parameter_missing');
	}
	return items.map((raw, index) => {
		const prefix = `line_items[${index}]`;
		if (typeof raw !== 'object' || Array.isArray(raw)) {
			throw invalid(`Invalid object: ${prefix} must be a hash`, prefix);
		}
		if (raw.price_data !== undefined) {
			throw invalid(
				`This local fake takes line items by price id only (${prefix}[price_data]).`,
				`${prefix}[price_data]`
			);
		}
		const priceId = reqString(raw, 'price', prefix);
		if (!store.prices.has(priceId)) throw noSuch('price', priceId, `${prefix}[price]`);
		const quantity = optInteger(raw, 'quantity', { min: 1, max: 999_999, prefix });
		if (quantity === undefined) {
			throw invalid(
				`Missing required param: ${prefix}[quantity].`,
				`${prefix}[quantity]`,
				'parameter_missing'
			);
		}
		return { id: newId('li', 24), priceId, quantity };
	});
}

function createSessionRoute({ params: p }: Context): Json {
	const mode = reqString(p, 'mode');
	if (mode !== 'subscription') {
		throw invalid(`This local fake supports mode=subscription only (got "${mode}").`, 'mode');
	}
	const uiMode = optString(p, 'ui_mode');
	if (uiMode !== undefined && uiMode !== 'hosted') {
		throw invalid(`This local fake supports the hosted page only (ui_mode=${uiMode}).`, 'ui_mode');
	}
	const lines = readLineItems(p);
	const customerId = optString(p, 'customer') || null;
	const customerEmail = email(p, 'customer_email') ?? null;
	if (customerId && customerEmail) {
		throw invalid(
			'You may only specify one of these parameters: customer, customer_email.',
			'customer_email'
		);
	}
	if (customerId) customerOf(customerId, 'customer');
	const clientReferenceId = optString(p, 'client_reference_id') || null;
	if (clientReferenceId && clientReferenceId.length > 200) {
		throw invalid('client_reference_id may be at most 200 characters.', 'client_reference_id');
	}
	const subscriptionData = optObject(p, 'subscription_data');
	for (const name of Object.keys(subscriptionData ?? {})) {
		if (name !== 'metadata') console.log(`ignored parameter: subscription_data[${name}]`);
	}
	const created = now();
	const session = {
		id: newId('cs_test', 58),
		created,
		expiresAt: created + 24 * 3600,
		customerId,
		customerEmail,
		clientReferenceId,
		metadata: readMetadata(p, 'metadata') ?? {},
		subscriptionMetadata: readMetadata(subscriptionData, 'metadata', {}, 'subscription_data') ?? {},
		successUrl: url(p, 'success_url'),
		cancelUrl: url(p, 'cancel_url'),
		lines,
		status: 'open' as const,
		subscriptionId: null,
		invoiceId: null
	};
	store.sessions.set(session.id, session);
	return renderSession(session);
}

function sessionOf(id: string) {
	const session = store.sessions.get(id);
	if (!session) throw noSuch('checkout.session', id);
	return session;
}

// ── subscriptions ────────────────────────────────────────────────────────────────────────────

const PRORATION = ['always_invoice', 'create_prorations', 'none'] as const;

function readSubscriptionChange(p: Params, sub: Subscription): SubscriptionChange {
	const proration = optString(p, 'proration_behavior');
	if (proration !== undefined && !(PRORATION as readonly string[]).includes(proration)) {
		throw invalid(
			`Invalid proration_behavior: must be one of ${PRORATION.join(', ')}`,
			'proration_behavior'
		);
	}
	const items = optArray(p, 'items')?.map((raw, index) => {
		const prefix = `items[${index}]`;
		if (typeof raw !== 'object' || Array.isArray(raw)) {
			throw invalid(`Invalid object: ${prefix} must be a hash`, prefix);
		}
		if (raw.deleted !== undefined || raw.id === undefined) {
			throw invalid(
				`This local fake only changes existing items: give ${prefix}[id] (and no [deleted]).`,
				`${prefix}[id]`
			);
		}
		const id = reqString(raw, 'id', prefix);
		if (!sub.items.some((item) => item.id === id)) {
			throw noSuch('subscription item', id, `${prefix}[id]`);
		}
		const priceId = optString(raw, 'price', prefix);
		if (priceId !== undefined && !store.prices.has(priceId)) {
			throw noSuch('price', priceId, `${prefix}[price]`);
		}
		return { id, priceId, quantity: optInteger(raw, 'quantity', { min: 0, prefix }) };
	});
	return {
		items,
		metadata: readMetadata(p, 'metadata', sub.metadata),
		cancelAtPeriodEnd: optBoolean(p, 'cancel_at_period_end'),
		prorationBehavior: proration as SubscriptionChange['prorationBehavior']
	};
}

function updateSubscriptionRoute({ params: p, request }: Context, id: string): Json {
	const sub = subscriptionOf(id);
	void updateSubscription(sub, readSubscriptionChange(p, sub), request);
	return renderSubscription(sub);
}

function cancelSubscriptionRoute({ params: p, request }: Context, id: string): Json {
	const sub = subscriptionOf(id);
	const details = optObject(p, 'cancellation_details');
	const comment = optString(details, 'comment', 'cancellation_details') || null;
	void cancelSubscription(sub, 'cancellation_requested', comment, request);
	return renderSubscription(sub);
}

const SUBSCRIPTION_STATUSES = ['active', 'past_due', 'canceled', 'ended', 'all'];

function listSubscriptionsRoute({ params: p }: Context): Json {
	const customer = optString(p, 'customer');
	const status = optString(p, 'status');
	if (status !== undefined && !SUBSCRIPTION_STATUSES.includes(status)) {
		throw invalid(`Invalid status: must be one of ${SUBSCRIPTION_STATUSES.join(', ')}`, 'status');
	}
	const subs = [...store.subscriptions.values()].reverse().filter((s) => {
		if (customer && s.customerId !== customer) return false;
		if (status === 'all') return true;
		if (status === 'ended' || status === 'canceled') return s.status === 'canceled';
		if (status) return s.status === status;
		return s.status !== 'canceled';
	});
	return page(subs, p, '/v1/subscriptions', renderSubscription);
}

// ── billing portal, invoices, prices, products ────────────────────────────────────────────────

function createPortalRoute({ params: p }: Context): Json {
	const customerId = reqString(p, 'customer');
	customerOf(customerId, 'customer');
	const portal = {
		id: newId('bps', 24),
		created: now(),
		customerId,
		returnUrl: url(p, 'return_url')
	};
	store.portalSessions.set(portal.id, portal);
	return renderPortalSession(portal);
}

const INVOICE_STATUSES = ['draft', 'open', 'paid', 'uncollectible', 'void'];

function listInvoicesRoute({ params: p }: Context): Json {
	const customer = optString(p, 'customer');
	const subscription = optString(p, 'subscription');
	const status = optString(p, 'status');
	if (status !== undefined && !INVOICE_STATUSES.includes(status)) {
		throw invalid(`Invalid status: must be one of ${INVOICE_STATUSES.join(', ')}`, 'status');
	}
	const invoices = [...store.invoices.values()]
		.reverse()
		.filter(
			(i) =>
				(!customer || i.customerId === customer) &&
				(!subscription || i.subscriptionId === subscription) &&
				(!status || i.status === status)
		);
	return page(invoices, p, '/v1/invoices', renderInvoice);
}

function lookup<T>(map: Map<string, T>, kind: string, render: (item: T) => Json): Handler {
	return (_ctx, id) => {
		const item = map.get(id);
		if (!item) throw noSuch(kind, id);
		return render(item);
	};
}

const ID = '([^/]+)';
const routes: Route[] = [
	{
		method: 'POST',
		pattern: /^\/v1\/customers$/,
		known: CUSTOMER_FIELDS,
		handle: createCustomerRoute
	},
	{
		method: 'GET',
		pattern: new RegExp(`^/v1/customers/${ID}$`),
		known: ['expand'],
		handle: (_ctx, id) => renderCustomer(customerOf(id))
	},
	{
		method: 'POST',
		pattern: new RegExp(`^/v1/customers/${ID}$`),
		known: CUSTOMER_FIELDS,
		handle: updateCustomerRoute
	},
	{
		method: 'POST',
		pattern: /^\/v1\/checkout\/sessions$/,
		known: [
			'mode',
			'ui_mode',
			'line_items',
			'customer',
			'customer_email',
			'client_reference_id',
			'metadata',
			'subscription_data',
			'success_url',
			'cancel_url',
			'expand'
		],
		handle: createSessionRoute
	},
	{
		method: 'GET',
		pattern: new RegExp(`^/v1/checkout/sessions/${ID}$`),
		known: ['expand'],
		handle: (_ctx, id) => renderSession(sessionOf(id))
	},
	{
		method: 'GET',
		pattern: new RegExp(`^/v1/checkout/sessions/${ID}/line_items$`),
		known: ['expand', 'limit', 'starting_after', 'ending_before'],
		handle: (_ctx, id) => renderCheckoutLines(sessionOf(id))
	},
	{
		method: 'GET',
		pattern: /^\/v1\/subscriptions$/,
		known: ['customer', 'status', 'limit', 'starting_after', 'ending_before', 'expand'],
		handle: listSubscriptionsRoute
	},
	{
		method: 'GET',
		pattern: new RegExp(`^/v1/subscriptions/${ID}$`),
		known: ['expand'],
		handle: (_ctx, id) => renderSubscription(subscriptionOf(id))
	},
	{
		method: 'POST',
		pattern: new RegExp(`^/v1/subscriptions/${ID}$`),
		known: ['items', 'proration_behavior', 'metadata', 'cancel_at_period_end', 'expand'],
		handle: updateSubscriptionRoute
	},
	{
		method: 'DELETE',
		pattern: new RegExp(`^/v1/subscriptions/${ID}$`),
		known: ['cancellation_details', 'invoice_now', 'prorate', 'expand'],
		handle: cancelSubscriptionRoute
	},
	{
		method: 'POST',
		pattern: /^\/v1\/billing_portal\/sessions$/,
		known: ['customer', 'return_url', 'expand'],
		handle: createPortalRoute
	},
	{
		method: 'GET',
		pattern: /^\/v1\/invoices$/,
		known: [
			'customer',
			'subscription',
			'status',
			'limit',
			'starting_after',
			'ending_before',
			'expand'
		],
		handle: listInvoicesRoute
	},
	{
		method: 'GET',
		pattern: new RegExp(`^/v1/invoices/${ID}$`),
		known: ['expand'],
		handle: lookup(store.invoices, 'invoice', renderInvoice)
	},
	{
		method: 'GET',
		pattern: new RegExp(`^/v1/prices/${ID}$`),
		known: ['expand'],
		handle: lookup(store.prices, 'price', renderPrice)
	},
	{
		method: 'GET',
		pattern: new RegExp(`^/v1/products/${ID}$`),
		known: ['expand'],
		handle: lookup(store.products, 'product', renderProduct)
	}
];

const KEY = /^sk_test_[A-Za-z0-9_]+$/;

function apiKey(req: IncomingMessage): string | null {
	const header = req.headers.authorization ?? '';
	if (header.startsWith('Bearer ')) return header.slice(7).trim();
	if (header.startsWith('Basic ')) {
		return Buffer.from(header.slice(6), 'base64').toString('utf8').split(':')[0];
	}
	return null;
}

async function readParams(
	req: IncomingMessage,
	url: URL
): Promise<{ raw: string; params: Params }> {
	const query = url.search.slice(1);
	const body = req.method === 'POST' || req.method === 'DELETE' ? await readBody(req) : '';
	const type = req.headers['content-type'] ?? '';
	if (body && type.includes('application/json')) {
		throw invalid(
			'Send parameters form-encoded (application/x-www-form-urlencoded), as the SDK does.'
		);
	}
	const raw = [query, body].filter(Boolean).join('&');
	return { raw, params: parseParams(raw) };
}

export async function handleApi(
	req: IncomingMessage,
	res: ServerResponse,
	url: URL
): Promise<void> {
	const requestId = newId('req', 14);
	const headers: Record<string, string> = {
		'request-id': requestId,
		'stripe-version': String(req.headers['stripe-version'] ?? config.apiVersion)
	};
	const method = req.method ?? 'GET';
	try {
		const key = apiKey(req);
		if (!key) {
			throw new ApiError(
				401,
				'invalid_request_error',
				'No API key given. Send your test secret key as "Authorization: Bearer sk_test_…".'
			);
		}
		if (!KEY.test(key)) {
			throw new ApiError(
				401,
				'invalid_request_error',
				`Invalid API key: this local fake accepts test secret keys (sk_test_…) only.`,
				'api_key_invalid'
			);
		}
		const route = routes.find((r) => r.method === method && r.pattern.test(url.pathname));
		if (!route) {
			throw new ApiError(
				404,
				'invalid_request_error',
				`Unrecognized request URL (${method}: ${url.pathname}). The local Stripe fake implements only the calls Pincer makes.`
			);
		}
		const { raw, params } = await readParams(req, url);
		const ignored = paramNames(params).filter((n) => !route.known.includes(n.split('[')[0]));
		if (ignored.length)
			console.log(`${method} ${url.pathname}: ignored parameters ${ignored.join(', ')}`);

		const idempotencyKey =
			method === 'POST' ? (req.headers['idempotency-key'] as string) || null : null;
		const fingerprint = `${method} ${url.pathname} ${raw}`;
		if (idempotencyKey) {
			const earlier = store.idempotent.get(idempotencyKey);
			if (earlier && earlier.fingerprint !== fingerprint) {
				throw new ApiError(
					400,
					'idempotency_error',
					`Idempotency key ${idempotencyKey} was first used with other parameters; use a new key.`
				);
			}
			if (earlier) {
				return sendJson(res, earlier.status, earlier.body, {
					...headers,
					'idempotent-replayed': 'true'
				});
			}
		}

		const id = decodeURIComponent(route.pattern.exec(url.pathname)?.[1] ?? '');
		const body = expand(
			route.handle({ params, request: { id: requestId, idempotency_key: idempotencyKey } }, id),
			readExpand(params)
		);
		if (idempotencyKey) store.idempotent.set(idempotencyKey, { fingerprint, status: 200, body });
		sendJson(res, 200, body, headers);
	} catch (err) {
		if (err instanceof ApiError) return sendJson(res, err.status, err.toJSON(), headers);
		console.error(err);
		const failure = new ApiError(500, 'api_error', 'The local Stripe fake failed; see its log.');
		sendJson(res, 500, failure.toJSON(), { ...headers, 'stripe-should-retry': 'false' });
	}
}
