// Renders the store's records in Stripe's JSON shapes (API version of the installed SDK), and
// expands ids into objects on request (`expand[]=subscription`).
import { config } from './config.ts';
import { ApiError, invalid } from './http.ts';
import {
	store,
	type CheckoutSession,
	type Customer,
	type Invoice,
	type InvoiceLine,
	type PortalSession,
	type Price,
	type Product,
	type Subscription,
	type SubscriptionItem
} from './store.ts';

export type Json = { [key: string]: unknown };

export function publicUrl(): string {
	return config.publicUrl;
}

export function list(data: Json[], url: string, hasMore = false): Json {
	return { object: 'list', data, has_more: hasMore, url };
}

export function renderCustomer(c: Customer): Json {
	return {
		id: c.id,
		object: 'customer',
		address: null,
		balance: 0,
		created: c.created,
		currency: null,
		default_source: null,
		delinquent: false,
		description: c.description,
		discount: null,
		email: c.email,
		invoice_prefix: c.invoicePrefix,
		invoice_settings: {
			custom_fields: null,
			default_payment_method: null,
			footer: null,
			rendering_options: null
		},
		livemode: false,
		metadata: { ...c.metadata },
		name: c.name,
		next_invoice_sequence: c.nextInvoiceNumber,
		phone: c.phone,
		preferred_locales: [],
		shipping: null,
		tax_exempt: 'none',
		test_clock: null
	};
}

export function renderProduct(p: Product): Json {
	return {
		id: p.id,
		object: 'product',
		active: true,
		created: p.created,
		default_price: config.priceId,
		description: p.description,
		images: [],
		livemode: false,
		marketing_features: [],
		metadata: {},
		name: p.name,
		package_dimensions: null,
		shippable: null,
		statement_descriptor: null,
		tax_code: null,
		type: 'service',
		unit_label: p.unitLabel,
		updated: p.created,
		url: null
	};
}

export function renderPrice(p: Price): Json {
	return {
		id: p.id,
		object: 'price',
		active: true,
		billing_scheme: 'per_unit',
		created: p.created,
		currency: p.currency,
		custom_unit_amount: null,
		livemode: false,
		lookup_key: p.lookupKey,
		metadata: {},
		nickname: p.nickname,
		product: p.productId,
		recurring: {
			interval: p.interval,
			interval_count: p.intervalCount,
			meter: null,
			trial_period_days: null,
			usage_type: 'licensed'
		},
		tax_behavior: 'unspecified',
		tiers_mode: null,
		transform_quantity: null,
		type: 'recurring',
		unit_amount: p.unitAmount,
		unit_amount_decimal: String(p.unitAmount)
	};
}

/** The legacy `plan` view of a recurring price, still present on subscription items. */
function renderPlan(p: Price): Json {
	return {
		id: p.id,
		object: 'plan',
		active: true,
		amount: p.unitAmount,
		amount_decimal: String(p.unitAmount),
		billing_scheme: 'per_unit',
		created: p.created,
		currency: p.currency,
		interval: p.interval,
		interval_count: p.intervalCount,
		livemode: false,
		metadata: {},
		meter: null,
		nickname: p.nickname,
		product: p.productId,
		tiers_mode: null,
		transform_usage: null,
		trial_period_days: null,
		usage_type: 'licensed'
	};
}

function priceOf(id: string): Price {
	const price = store.prices.get(id);
	if (!price) throw new ApiError(500, 'api_error', `price ${id} vanished from the fake's store`);
	return price;
}

export function sessionTotal(s: CheckoutSession): number {
	return s.lines.reduce((sum, l) => sum + l.quantity * priceOf(l.priceId).unitAmount, 0);
}

function renderCheckoutLines(s: CheckoutSession): Json {
	const data = s.lines.map((l) => {
		const price = priceOf(l.priceId);
		const amount = l.quantity * price.unitAmount;
		return {
			id: l.id,
			object: 'item',
			amount_discount: 0,
			amount_subtotal: amount,
			amount_tax: 0,
			amount_total: amount,
			currency: price.currency,
			description: store.products.get(price.productId)?.name ?? price.nickname,
			price: renderPrice(price),
			quantity: l.quantity
		};
	});
	return list(data, `/v1/checkout/sessions/${s.id}/line_items`);
}

export function effectiveStatus(s: CheckoutSession): CheckoutSession['status'] {
	return s.status === 'open' && s.expiresAt <= Math.floor(Date.now() / 1000) ? 'expired' : s.status;
}

export function renderSession(s: CheckoutSession): Json {
	const total = sessionTotal(s);
	const customer = s.customerId ? store.customers.get(s.customerId) : undefined;
	const status = effectiveStatus(s);
	const currency = s.lines.length ? priceOf(s.lines[0].priceId).currency : config.currency;
	return {
		id: s.id,
		object: 'checkout.session',
		adaptive_pricing: null,
		after_expiration: null,
		allow_promotion_codes: null,
		amount_subtotal: total,
		amount_total: total,
		automatic_tax: { enabled: false, liability: null, provider: null, status: null },
		billing_address_collection: null,
		cancel_url: s.cancelUrl,
		client_reference_id: s.clientReferenceId,
		client_secret: null,
		consent: null,
		consent_collection: null,
		created: s.created,
		currency,
		currency_conversion: null,
		custom_fields: [],
		custom_text: {
			after_submit: null,
			shipping_address: null,
			submit: null,
			terms_of_service_acceptance: null
		},
		customer: s.customerId,
		customer_creation: s.customerId && status === 'open' ? null : 'always',
		customer_details:
			status === 'complete'
				? {
						address: null,
						email: customer?.email ?? s.customerEmail,
						name: customer?.name ?? null,
						phone: null,
						tax_exempt: 'none',
						tax_ids: []
					}
				: null,
		customer_email: s.customerEmail,
		discounts: [],
		expires_at: s.expiresAt,
		invoice: s.invoiceId,
		invoice_creation: null,
		livemode: false,
		locale: null,
		metadata: { ...s.metadata },
		mode: 'subscription',
		payment_intent: null,
		payment_link: null,
		payment_method_collection: 'always',
		payment_method_options: {},
		payment_method_types: ['card'],
		payment_status: status === 'complete' ? 'paid' : 'unpaid',
		phone_number_collection: { enabled: false },
		recovered_from: null,
		saved_payment_method_options: null,
		setup_intent: null,
		shipping_address_collection: null,
		shipping_cost: null,
		shipping_options: [],
		status,
		submit_type: null,
		subscription: s.subscriptionId,
		success_url: s.successUrl,
		total_details: { amount_discount: 0, amount_shipping: 0, amount_tax: 0 },
		ui_mode: 'hosted',
		url: status === 'open' ? `${publicUrl()}/pay/${s.id}` : null
	};
}

function renderSubscriptionItem(item: SubscriptionItem, sub: Subscription): Json {
	const price = priceOf(item.priceId);
	return {
		id: item.id,
		object: 'subscription_item',
		billing_thresholds: null,
		created: item.created,
		current_period_end: sub.periodEnd,
		current_period_start: sub.periodStart,
		discounts: [],
		metadata: {},
		plan: renderPlan(price),
		price: renderPrice(price),
		quantity: item.quantity,
		subscription: sub.id,
		tax_rates: []
	};
}

export function renderSubscriptionItems(sub: Subscription): Json {
	return list(
		sub.items.map((item) => renderSubscriptionItem(item, sub)),
		`/v1/subscription_items?subscription=${sub.id}`
	);
}

export function renderSubscription(sub: Subscription): Json {
	const currency = sub.items.length ? priceOf(sub.items[0].priceId).currency : config.currency;
	return {
		id: sub.id,
		object: 'subscription',
		application: null,
		application_fee_percent: null,
		automatic_tax: { disabled_reason: null, enabled: false, liability: null },
		billing_cycle_anchor: sub.created,
		billing_cycle_anchor_config: null,
		billing_mode: { flexible: null, type: 'classic' },
		billing_schedules: [],
		billing_thresholds: null,
		cancel_at: sub.cancelAtPeriodEnd ? sub.periodEnd : null,
		cancel_at_period_end: sub.cancelAtPeriodEnd,
		canceled_at: sub.canceledAt,
		cancellation_details: {
			comment: sub.cancellation?.comment ?? null,
			feedback: null,
			reason: sub.cancellation?.reason ?? null
		},
		collection_method: 'charge_automatically',
		created: sub.created,
		currency,
		customer: sub.customerId,
		days_until_due: null,
		default_payment_method: sub.paymentMethodId,
		default_source: null,
		default_tax_rates: [],
		description: null,
		discounts: [],
		ended_at: sub.endedAt,
		invoice_settings: {
			account_tax_ids: null,
			custom_fields: null,
			description: null,
			footer: null,
			issuer: { type: 'self' }
		},
		items: renderSubscriptionItems(sub),
		latest_invoice: sub.latestInvoiceId,
		livemode: false,
		metadata: { ...sub.metadata },
		next_pending_invoice_item_invoice: null,
		on_behalf_of: null,
		pause_collection: null,
		payment_settings: {
			payment_method_options: null,
			payment_method_types: null,
			save_default_payment_method: 'off'
		},
		pending_invoice_item_interval: null,
		pending_setup_intent: null,
		pending_update: null,
		schedule: null,
		start_date: sub.created,
		status: sub.status,
		test_clock: null,
		transfer_data: null,
		trial_end: null,
		trial_settings: { end_behavior: { missing_payment_method: 'create_invoice' } },
		trial_start: null
	};
}

export function invoiceTotal(invoice: Invoice): number {
	return invoice.lines.reduce((sum, l) => sum + l.amount, 0);
}

function renderInvoiceLine(line: InvoiceLine, invoice: Invoice): Json {
	const price = priceOf(line.priceId);
	return {
		id: line.id,
		object: 'line_item',
		amount: line.amount,
		currency: invoice.currency,
		description: line.description,
		discount_amounts: [],
		discountable: true,
		discounts: [],
		invoice: invoice.id,
		livemode: false,
		metadata: {},
		parent: {
			invoice_item_details: null,
			subscription_item_details: {
				invoice_item: null,
				proration: line.proration,
				proration_details: { credited_items: null },
				subscription: invoice.subscriptionId,
				subscription_item: line.subscriptionItemId
			},
			type: 'subscription_item_details'
		},
		period: { end: line.periodEnd, start: line.periodStart },
		pretax_credit_amounts: [],
		pricing: {
			price_details: { price: price.id, product: price.productId },
			type: 'price_details',
			unit_amount_decimal: String(price.unitAmount)
		},
		quantity: line.quantity,
		subtotal: line.amount,
		taxes: []
	};
}

export function renderInvoice(invoice: Invoice): Json {
	const customer = store.customers.get(invoice.customerId);
	const subscription = store.subscriptions.get(invoice.subscriptionId);
	const total = invoiceTotal(invoice);
	const paid = invoice.status === 'paid' ? total : 0;
	return {
		id: invoice.id,
		object: 'invoice',
		account_country: 'US',
		account_name: 'Pincer (local test payments)',
		account_tax_ids: null,
		amount_due: total,
		amount_overpaid: 0,
		amount_paid: paid,
		amount_remaining: total - paid,
		amount_shipping: 0,
		application: null,
		attempt_count: invoice.attemptCount,
		attempted: invoice.attemptCount > 0,
		auto_advance: invoice.status !== 'paid',
		automatic_tax: {
			disabled_reason: null,
			enabled: false,
			liability: null,
			provider: null,
			status: null
		},
		automatically_finalizes_at: null,
		billing_reason: invoice.billingReason,
		collection_method: 'charge_automatically',
		created: invoice.created,
		currency: invoice.currency,
		custom_fields: null,
		customer: invoice.customerId,
		customer_address: null,
		customer_email: customer?.email ?? null,
		customer_name: customer?.name ?? null,
		customer_phone: null,
		customer_shipping: null,
		customer_tax_exempt: 'none',
		customer_tax_ids: [],
		default_payment_method: null,
		default_source: null,
		default_tax_rates: [],
		description: null,
		discounts: [],
		due_date: null,
		effective_at: invoice.created,
		ending_balance: 0,
		footer: null,
		from_invoice: null,
		hosted_invoice_url: `${publicUrl()}/invoice/${invoice.id}`,
		invoice_pdf: null,
		issuer: { type: 'self' },
		last_finalization_error: null,
		latest_revision: null,
		lines: list(
			invoice.lines.map((l) => renderInvoiceLine(l, invoice)),
			`/v1/invoices/${invoice.id}/lines`
		),
		livemode: false,
		metadata: {},
		next_payment_attempt: invoice.nextPaymentAttempt,
		number: invoice.number,
		on_behalf_of: null,
		parent: {
			quote_details: null,
			subscription_details: {
				metadata: { ...(subscription?.metadata ?? {}) },
				subscription: invoice.subscriptionId
			},
			type: 'subscription_details'
		},
		payment_settings: {
			default_mandate: null,
			payment_method_options: null,
			payment_method_types: null
		},
		period_end: invoice.periodEnd,
		period_start: invoice.periodStart,
		post_payment_credit_notes_amount: 0,
		pre_payment_credit_notes_amount: 0,
		receipt_number: null,
		rendering: null,
		shipping_cost: null,
		shipping_details: null,
		starting_balance: 0,
		statement_descriptor: null,
		status: invoice.status,
		status_transitions: {
			finalized_at: invoice.created,
			marked_uncollectible_at: null,
			paid_at: invoice.paidAt,
			voided_at: null
		},
		subtotal: total,
		subtotal_excluding_tax: total,
		test_clock: null,
		total,
		total_discount_amounts: [],
		total_excluding_tax: total,
		total_pretax_credit_amounts: [],
		total_taxes: [],
		webhooks_delivered_at: invoice.created
	};
}

export function renderPortalSession(p: PortalSession): Json {
	return {
		id: p.id,
		object: 'billing_portal.session',
		configuration: 'bpc_pincer_default',
		created: p.created,
		customer: p.customerId,
		customer_account: null,
		flow: null,
		livemode: false,
		locale: null,
		on_behalf_of: null,
		return_url: p.returnUrl,
		url: `${publicUrl()}/portal/${p.id}`
	};
}

/** Any stored object by id, rendered; used to expand ids. */
function renderById(id: string): Json | undefined {
	const customer = store.customers.get(id);
	if (customer) return renderCustomer(customer);
	const subscription = store.subscriptions.get(id);
	if (subscription) return renderSubscription(subscription);
	const invoice = store.invoices.get(id);
	if (invoice) return renderInvoice(invoice);
	const price = store.prices.get(id);
	if (price) return renderPrice(price);
	const product = store.products.get(id);
	if (product) return renderProduct(product);
	const session = store.sessions.get(id);
	if (session) return renderSession(session);
	return undefined;
}

function expandPath(node: unknown, path: string[], full: string): void {
	if (path.length === 0 || node === null || typeof node !== 'object') return;
	if (Array.isArray(node)) {
		for (const element of node) expandPath(element, path, full);
		return;
	}
	const obj = node as Json;
	const [key, ...rest] = path;
	let value = obj[key];
	if (key === 'line_items' && obj.object === 'checkout.session' && value === undefined) {
		const session = store.sessions.get(String(obj.id));
		if (session) value = renderCheckoutLines(session);
	} else if (typeof value === 'string') {
		value = renderById(value);
		if (value === undefined) throw invalid(`This property cannot be expanded (${full}).`, 'expand');
	} else if (value === undefined) {
		throw invalid(`This property cannot be expanded (${full}).`, 'expand');
	}
	obj[key] = value;
	expandPath(value, rest, full);
}

/** Replaces ids on the given dotted paths by their objects, as Stripe's `expand` does. */
export function expand(object: Json, paths: string[]): Json {
	for (const path of paths) {
		const segments = path.split('.');
		if (segments.length > 4)
			throw invalid(`You cannot expand more than 4 levels (${path}).`, 'expand');
		expandPath(object, segments, path);
	}
	return object;
}

export { renderCheckoutLines };
