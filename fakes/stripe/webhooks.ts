// Events and their delivery: every event is signed with the SDK's own test-header helper and
// POSTed to PINCER_STRIPE_WEBHOOK_URL, one at a time and in order, with a few retries. Without a
// URL, events are held (and logged) until one is set through /_fake/webhook-url.
import Stripe from 'stripe';
import { config } from './config.ts';
import type { Json } from './objects.ts';
import { newId, now } from './store.ts';

export type EventRequest = { id: string | null; idempotency_key: string | null };

export type StoredEvent = { id: string; type: string; body: Json };

export type Delivery = {
	event_id: string;
	type: string;
	resend: boolean;
	attempt: number;
	url: string;
	status: number | null;
	error: string | null;
	ok: boolean;
	at: string;
	duration_ms: number;
};

const AUTOMATIC: EventRequest = { id: null, idempotency_key: null };
const TIMEOUT_MS = 10_000;

const events: StoredEvent[] = [];
const byId = new Map<string, StoredEvent>();
const deliveries: Delivery[] = [];
let held: StoredEvent[] = [];
let webhookUrl: string | null = config.webhookUrl;
let tail: Promise<unknown> = Promise.resolve();
let pending = 0;
let generation = 0;

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/**
 * Records an event with a snapshot of `object` as it is now, and queues its delivery.
 * The promise settles once delivered or given up (it never rejects).
 */
export function publish(
	type: string,
	object: Json,
	options: { previous?: Json; request?: EventRequest } = {}
): Promise<Delivery[]> {
	const data: Json = { object: structuredClone(object) };
	if (options.previous) data.previous_attributes = structuredClone(options.previous);
	const body: Json = {
		id: newId('evt', 24),
		object: 'event',
		api_version: config.apiVersion,
		created: now(),
		data,
		livemode: false,
		pending_webhooks: webhookUrl ? 1 : 0,
		request: options.request ?? AUTOMATIC,
		type
	};
	const event: StoredEvent = { id: String(body.id), type, body };
	events.push(event);
	byId.set(event.id, event);
	return enqueue(event, false);
}

function enqueue(event: StoredEvent, resend: boolean): Promise<Delivery[]> {
	if (!webhookUrl) {
		held.push(event);
		console.log(`webhook held: ${event.type} ${event.id} (PINCER_STRIPE_WEBHOOK_URL is unset)`);
		return Promise.resolve([]);
	}
	const gen = generation;
	pending++;
	const run = tail.then(() => deliver(event, resend, gen)).finally(() => pending--);
	tail = run;
	return run;
}

async function deliver(event: StoredEvent, resend: boolean, gen: number): Promise<Delivery[]> {
	const payload = JSON.stringify(event.body, null, 2);
	const attempts: Delivery[] = [];
	for (let attempt = 1; attempt <= config.webhookAttempts; attempt++) {
		const url = webhookUrl;
		if (gen !== generation) return attempts;
		if (!url) {
			held.push(event);
			return attempts;
		}
		// A fresh timestamp per attempt, as a real retry would carry.
		const signature = Stripe.webhooks.generateTestHeaderString({
			payload,
			secret: config.webhookSecret
		});
		const started = Date.now();
		let status: number | null = null;
		let error: string | null = null;
		try {
			const response = await fetch(url, {
				method: 'POST',
				headers: {
					'content-type': 'application/json; charset=utf-8',
					'stripe-signature': signature,
					'user-agent': 'PincerStripeFake/1.0'
				},
				body: payload,
				redirect: 'manual',
				signal: AbortSignal.timeout(TIMEOUT_MS)
			});
			status = response.status;
			await response.arrayBuffer().catch(() => undefined);
		} catch (err) {
			const cause =
				err instanceof Error && err.cause instanceof Error ? `: ${err.cause.message}` : '';
			error = err instanceof Error ? `${err.message}${cause}` : String(err);
		}
		if (gen !== generation) return attempts;
		const ok = status !== null && status >= 200 && status < 300;
		const record: Delivery = {
			event_id: event.id,
			type: event.type,
			resend,
			attempt,
			url,
			status,
			error,
			ok,
			at: new Date(started).toISOString(),
			duration_ms: Date.now() - started
		};
		deliveries.push(record);
		attempts.push(record);
		console.log(
			`webhook ${event.type} ${event.id}${resend ? ' (resent)' : ''} attempt ${attempt} → ${status ?? error}`
		);
		if (ok) return attempts;
		if (attempt < config.webhookAttempts) await sleep(config.webhookBackoffMs * 2 ** (attempt - 1));
	}
	console.log(
		`webhook ${event.type} ${event.id}: gave up after ${config.webhookAttempts} attempts`
	);
	return attempts;
}

/** Sends a recorded event again, with the same id and body (to exercise idempotent handlers). */
export function resend(eventId: string): Promise<Delivery[]> | null {
	const event = byId.get(eventId);
	return event ? enqueue(event, true) : null;
}

export function findEvent(eventId: string): StoredEvent | undefined {
	return byId.get(eventId);
}

export function listEvents(): StoredEvent[] {
	return [...events];
}

export function listDeliveries(): Delivery[] {
	return [...deliveries];
}

export function webhookState() {
	return { webhook_url: webhookUrl, pending, held: held.map((e) => e.id) };
}

/** Resolves once nothing is queued or being delivered (or after `timeoutMs`). */
export async function idle(timeoutMs = 15_000): Promise<void> {
	const deadline = Date.now() + timeoutMs;
	while (pending > 0 && Date.now() < deadline) {
		await Promise.race([tail, sleep(Math.max(0, deadline - Date.now()))]);
	}
}

/** Points deliveries somewhere else; held events are then delivered in order. */
export function setWebhookUrl(url: string | null): Promise<Delivery[][]> {
	webhookUrl = url;
	if (!url) return Promise.resolve([]);
	const waiting = held;
	held = [];
	return Promise.all(waiting.map((event) => enqueue(event, false)));
}

export function resetWebhooks(): void {
	generation++;
	events.length = 0;
	deliveries.length = 0;
	byId.clear();
	held = [];
}
