// The pages a browser visits: hosted checkout (/pay/…), billing portal (/portal/…), invoice
// receipts (/invoice/…) and an overview at /. Forms are ordinary POSTs answered with 303.
import type { IncomingMessage, ServerResponse } from 'node:http';
import { cancelSubscription, completeCheckout, updateSubscription } from './billing.ts';
import { parseParams, type Params } from './form.ts';
import { ApiError, readBody, redirect, sendHtml } from './http.ts';
import { effectiveStatus, sessionTotal } from './objects.ts';
import {
	renderCheckout,
	renderCheckoutClosed,
	renderInvoicePage,
	renderMissing,
	renderOverview,
	renderPortal,
	type PortalView
} from './pages.ts';
import {
	invoicesOf,
	monthlyAmount,
	seatCount,
	store,
	subscriptionsOf,
	type CheckoutSession,
	type PortalSession
} from './store.ts';
import { listEvents } from './webhooks.ts';

const APPROVED = '4242424242424242';
const DECLINED = '4000000000000002';
/** How long a page waits for its webhooks before answering anyway. */
const DELIVERY_WAIT_MS = 15_000;

function within(promise: Promise<unknown>, ms: number): Promise<unknown> {
	return Promise.race([promise, new Promise((resolve) => setTimeout(resolve, ms).unref())]);
}

function field(form: Params, name: string): string {
	const value = form[name];
	return typeof value === 'string' ? value.trim() : '';
}

/** Checks the card form; returns what to tell the payer, or null when the card is approved. */
function cardProblem(form: Params): { status: number; message: string } | null {
	const number = field(form, 'card_number').replace(/[\s-]/g, '');
	if (!number) return { status: 400, message: 'Enter a card number.' };
	if (!/^\d{12,19}$/.test(number))
		return { status: 400, message: 'That card number is not valid.' };
	const expiry = /^(\d{1,2})\s*\/\s*(\d{2}|\d{4})$/.exec(field(form, 'expiry'));
	const month = expiry ? Number(expiry[1]) : 0;
	if (!expiry || month < 1 || month > 12) {
		return { status: 400, message: 'Enter the expiry date as MM / YY.' };
	}
	const year = expiry[2].length === 2 ? 2000 + Number(expiry[2]) : Number(expiry[2]);
	if (Date.UTC(year, month, 1) <= Date.now()) {
		return { status: 400, message: 'That card has expired; use a future expiry date.' };
	}
	if (!/^\d{3,4}$/.test(field(form, 'cvc'))) {
		return { status: 400, message: 'Enter the 3- or 4-digit security code (CVC).' };
	}
	if (number === DECLINED) {
		return {
			status: 402,
			message: 'Your card was declined. Nothing was charged; try another card.'
		};
	}
	if (number !== APPROVED) {
		return {
			status: 400,
			message:
				'Unsupported test card. Pay with 4242 4242 4242 4242, or use 4000 0000 0000 0002 to see a decline.'
		};
	}
	return null;
}

function checkoutView(session: CheckoutSession) {
	const first = session.lines[0];
	const price = store.prices.get(first.priceId)!;
	const customer = session.customerId ? store.customers.get(session.customerId) : undefined;
	const payingAs = customer?.email ?? customer?.name ?? session.customerEmail;
	return {
		session,
		productName: store.products.get(price.productId)?.name ?? price.nickname,
		seats: session.lines.reduce((sum, l) => sum + l.quantity, 0),
		unitAmount: price.unitAmount,
		currency: price.currency,
		total: sessionTotal(session),
		payingAs: payingAs ?? null,
		askEmail: !payingAs
	};
}

async function payPage(req: IncomingMessage, res: ServerResponse, id: string): Promise<void> {
	const session = store.sessions.get(id);
	if (!session) return sendHtml(res, 404, renderMissing('There is no checkout with this address.'));
	const status = effectiveStatus(session);
	if (req.method === 'GET') {
		if (status !== 'open') return sendHtml(res, 200, renderCheckoutClosed(session, status));
		return sendHtml(res, 200, renderCheckout(checkoutView(session)));
	}
	const form = parseParams(await readBody(req));
	const successUrl = session.successUrl?.replaceAll('{CHECKOUT_SESSION_ID}', session.id);
	if (status === 'complete' && successUrl) return redirect(res, successUrl);
	if (status !== 'open') return sendHtml(res, 409, renderCheckoutClosed(session, status));

	const view = checkoutView(session);
	const values = {
		expiry: field(form, 'expiry'),
		cardholder: field(form, 'cardholder'),
		email: field(form, 'email')
	};
	const problem = cardProblem(form);
	const email = values.email || null;
	if (!problem && view.askEmail && (!email || !/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(email))) {
		return sendHtml(
			res,
			400,
			renderCheckout({ ...view, values, error: 'Enter an email address for receipts.' })
		);
	}
	if (problem) {
		console.log(`checkout ${session.id}: card refused (${problem.message})`);
		return sendHtml(
			res,
			problem.status,
			renderCheckout({ ...view, values, error: problem.message })
		);
	}

	const { subscription, delivered } = completeCheckout(session, email);
	console.log(`checkout ${session.id}: paid, ${subscription.id} active`);
	await within(delivered, DELIVERY_WAIT_MS);
	if (successUrl) return redirect(res, successUrl);
	sendHtml(res, 200, renderCheckoutClosed(session, 'complete'));
}

function portalView(portal: PortalSession, notice?: PortalView['notice']): PortalView {
	const customer = store.customers.get(portal.customerId)!;
	return {
		portalId: portal.id,
		customer,
		returnUrl: portal.returnUrl,
		subscriptions: subscriptionsOf(customer.id).map((sub) => {
			const price = store.prices.get(sub.items[0].priceId)!;
			return {
				sub,
				productName: store.products.get(price.productId)?.name ?? price.nickname,
				seats: seatCount(sub),
				unitAmount: price.unitAmount,
				monthly: monthlyAmount(sub),
				currency: price.currency
			};
		}),
		invoices: invoicesOf(customer.id).map((invoice) => ({
			invoice,
			total: invoice.lines.reduce((sum, l) => sum + l.amount, 0)
		})),
		notice
	};
}

const NOTICES: Record<string, PortalView['notice']> = {
	seats: { kind: 'ok', text: 'Seat count updated.' },
	unchanged: { kind: 'ok', text: 'Nothing changed.' },
	canceled: { kind: 'ok', text: 'Subscription canceled.' }
};

async function portalPage(
	req: IncomingMessage,
	res: ServerResponse,
	parts: string[],
	url: URL
): Promise<void> {
	const portal = store.portalSessions.get(parts[1]);
	if (!portal)
		return sendHtml(res, 404, renderMissing('There is no billing page with this address.'));
	const home = `/portal/${portal.id}`;
	if (req.method === 'GET' && parts.length === 2) {
		return sendHtml(
			res,
			200,
			renderPortal(portalView(portal, NOTICES[url.searchParams.get('notice') ?? '']))
		);
	}
	const sub = parts[2] === 'subscriptions' ? store.subscriptions.get(parts[3]) : undefined;
	if (req.method !== 'POST' || !sub || sub.customerId !== portal.customerId || parts.length !== 5) {
		return sendHtml(res, 404, renderMissing('Nothing to do at this address.'));
	}
	const form = parseParams(await readBody(req));
	try {
		if (parts[4] === 'seats') {
			const raw = field(form, 'quantity');
			const quantity = Number(raw);
			if (!/^\d+$/.test(raw) || quantity < 1 || quantity > 10_000) {
				const notice = { kind: 'alert' as const, text: 'Choose between 1 and 10,000 seats.' };
				return sendHtml(res, 400, renderPortal(portalView(portal, notice)));
			}
			if (quantity === seatCount(sub)) return redirect(res, `${home}?notice=unchanged`);
			await within(
				updateSubscription(sub, {
					items: [{ id: sub.items[0].id, quantity }],
					prorationBehavior: 'create_prorations'
				}),
				DELIVERY_WAIT_MS
			);
			return redirect(res, `${home}?notice=seats`);
		}
		if (parts[4] === 'cancel') {
			await within(cancelSubscription(sub, 'cancellation_requested', null), DELIVERY_WAIT_MS);
			return redirect(res, `${home}?notice=canceled`);
		}
	} catch (err) {
		if (!(err instanceof ApiError)) throw err;
		return sendHtml(
			res,
			400,
			renderPortal(portalView(portal, { kind: 'alert', text: err.message }))
		);
	}
	sendHtml(res, 404, renderMissing('Nothing to do at this address.'));
}

function overview(res: ServerResponse): void {
	const counts = {
		Customers: store.customers.size,
		'Checkout sessions': store.sessions.size,
		Subscriptions: store.subscriptions.size,
		Invoices: store.invoices.size
	};
	const recent = listEvents()
		.slice(-20)
		.reverse()
		.map((event) => `${event.id}  ${event.type}`);
	sendHtml(res, 200, renderOverview(counts, recent));
}

/** Serves the hosted pages; false when the path is not one of them. */
export async function handleHosted(
	req: IncomingMessage,
	res: ServerResponse,
	url: URL
): Promise<boolean> {
	const parts = url.pathname.split('/').filter(Boolean).map(decodeURIComponent);
	const method = req.method ?? 'GET';
	if (parts.length === 0 && method === 'GET') {
		overview(res);
		return true;
	}
	if (parts[0] === 'pay' && parts.length === 2 && (method === 'GET' || method === 'POST')) {
		await payPage(req, res, parts[1]);
		return true;
	}
	if (parts[0] === 'portal' && parts.length >= 2) {
		await portalPage(req, res, parts, url);
		return true;
	}
	if (parts[0] === 'invoice' && parts.length === 2 && method === 'GET') {
		const invoice = store.invoices.get(parts[1]);
		if (!invoice) sendHtml(res, 404, renderMissing('There is no invoice with this address.'));
		else sendHtml(res, 200, renderInvoicePage(invoice, store.customers.get(invoice.customerId)));
		return true;
	}
	return false;
}
