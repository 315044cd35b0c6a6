// Test controls under /_fake (JSON in, JSON out): webhook deliveries, resending events,
// renewals that succeed or fail, cancellation by "Stripe", and a full reset.
import type { IncomingMessage, ServerResponse } from 'node:http';
import { cancelSubscription, renew } from './billing.ts';
import { parseParams, type Params } from './form.ts';
import { ApiError, invalid, noSuch, readBody, sendJson } from './http.ts';
import { renderCustomer, renderInvoice, renderSession, renderSubscription } from './objects.ts';
import { resetStore, store } from './store.ts';
import {
	findEvent,
	idle,
	listDeliveries,
	listEvents,
	resend,
	resetWebhooks,
	setWebhookUrl,
	webhookState
} from './webhooks.ts';

const HELP = {
	'GET /_fake/deliveries': 'webhook delivery attempts, oldest first (waits for the queue to drain)',
	'GET /_fake/events': 'events, oldest first (?type= to filter)',
	'GET /_fake/events/:id': 'one event',
	'POST /_fake/events/:id/resend': 'deliver an event again, same id and body',
	'POST /_fake/subscriptions/:id/renew': 'run the next renewal now; the charge succeeds',
	'POST /_fake/subscriptions/:id/fail-renewal':
		'run the next renewal now; the charge fails (invoice.payment_failed, past_due)',
	'POST /_fake/subscriptions/:id/cancel':
		'cancel as Stripe would ({"reason": "payment_failed" | "payment_disputed" | "cancellation_requested"})',
	'POST /_fake/webhook-url': 'set {"url": "…"} (or null) for deliveries; held events are sent',
	'GET /_fake/state': 'every stored object',
	'POST /_fake/reset': 'forget everything (the seeded price stays)'
};

async function readJson(req: IncomingMessage): Promise<Params | Record<string, unknown>> {
	const text = await readBody(req);
	if (!text.trim()) return {};
	if ((req.headers['content-type'] ?? '').includes('application/json')) {
		try {
			const value: unknown = JSON.parse(text);
			if (value && typeof value === 'object' && !Array.isArray(value)) {
				return value as Record<string, unknown>;
			}
		} catch {
			// reported below
		}
		throw invalid('Send a JSON object.');
	}
	return parseParams(text);
}

function subscriptionOf(id: string) {
	const sub = store.subscriptions.get(id);
	if (!sub) throw noSuch('subscription', id);
	return sub;
}

const REASONS = ['payment_failed', 'payment_disputed', 'cancellation_requested'] as const;

async function route(req: IncomingMessage, parts: string[], url: URL): Promise<unknown> {
	const method = req.method ?? 'GET';
	const [, what, id, action] = parts;
	if (!what && method === 'GET') return HELP;

	if (what === 'deliveries' && method === 'GET') {
		await idle();
		return { ...webhookState(), data: listDeliveries() };
	}
	if (what === 'events' && method === 'GET' && !id) {
		const type = url.searchParams.get('type');
		return {
			data: listEvents()
				.filter((e) => !type || e.type === type)
				.map((e) => e.body)
		};
	}
	if (what === 'events' && id && method === 'GET' && !action) {
		const event = findEvent(id);
		if (!event) throw noSuch('event', id);
		return event.body;
	}
	if (what === 'events' && id && action === 'resend' && method === 'POST') {
		const run = resend(id);
		if (!run) throw noSuch('event', id);
		return { event_id: id, attempts: await run };
	}
	if (what === 'subscriptions' && id && method === 'POST') {
		const sub = subscriptionOf(id);
		if (action === 'renew' || action === 'fail-renewal') {
			const { invoice, delivered } = renew(sub, action === 'renew' ? 'succeed' : 'fail');
			await delivered;
			return {
				subscription: renderSubscription(sub),
				invoice: invoice ? renderInvoice(invoice) : null
			};
		}
		if (action === 'cancel') {
			const body = await readJson(req);
			const reason = body.reason ?? 'payment_failed';
			if (typeof reason !== 'string' || !(REASONS as readonly string[]).includes(reason)) {
				throw invalid(`reason must be one of ${REASONS.join(', ')}`, 'reason');
			}
			await cancelSubscription(sub, reason as (typeof REASONS)[number], null);
			return { subscription: renderSubscription(sub) };
		}
	}
	if (what === 'webhook-url' && method === 'POST') {
		const body = await readJson(req);
		const url = body.url ?? null;
		if (url !== null && (typeof url !== 'string' || !/^https?:\/\//.test(url))) {
			throw invalid('url must be an http(s) URL or null', 'url');
		}
		await setWebhookUrl(url);
		return webhookState();
	}
	if (what === 'state' && method === 'GET') {
		return {
			customers: [...store.customers.values()].map(renderCustomer),
			checkout_sessions: [...store.sessions.values()].map(renderSession),
			subscriptions: [...store.subscriptions.values()].map(renderSubscription),
			invoices: [...store.invoices.values()].map(renderInvoice),
			...webhookState()
		};
	}
	if (what === 'reset' && method === 'POST') {
		resetWebhooks();
		resetStore();
		return { reset: true };
	}
	throw new ApiError(
		404,
		'invalid_request_error',
		`No test control at ${method} /${parts.join('/')}`
	);
}

export async function handleControls(
	req: IncomingMessage,
	res: ServerResponse,
	url: URL
): Promise<void> {
	const parts = url.pathname.split('/').filter(Boolean).map(decodeURIComponent);
	try {
		sendJson(res, 200, await route(req, parts, url));
	} catch (err) {
		if (err instanceof ApiError) return sendJson(res, err.status, err.toJSON());
		throw err;
	}
}
