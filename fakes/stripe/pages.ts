// HTML of the hosted pages (checkout, billing portal, invoice receipt, overview). Plain and
// self-contained: no scripts, no outside requests, ordinary form posts.
import { formatMoney } from './billing.ts';
import type { CheckoutSession, Customer, Invoice, Subscription } from './store.ts';

export function escapeHtml(text: string): string {
	return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

const e = escapeHtml;

export function formatDate(timestamp: number): string {
	return new Date(timestamp * 1000).toLocaleDateString('en-GB', {
		timeZone: 'UTC',
		day: 'numeric',
		month: 'long',
		year: 'numeric'
	});
}

const style = `
	:root { --paper: #f3ead6; --sheet: #fbf7ec; --ink: #211c15; --muted: #6b604f; --rule: #d9c8a2;
		--brass: #a7772a; --brass-deep: #7d5717; --alarm: #9a2d1c; --calm: #3f6b3a; }
	* { box-sizing: border-box; }
	body { margin: 0; background: var(--paper); color: var(--ink);
		font: 16px/1.55 system-ui, -apple-system, 'Segoe UI', sans-serif; }
	header { border-bottom: 3px double var(--brass); background: var(--sheet); }
	header div { max-width: 58rem; margin: 0 auto; padding: .9rem 1.5rem; display: flex;
		align-items: baseline; gap: .75rem; }
	.mark { font: 700 1.35rem/1 Georgia, 'Times New Roman', serif; letter-spacing: .02em; }
	.tag { font-size: .72rem; text-transform: uppercase; letter-spacing: .12em; color: var(--brass-deep);
		border: 1px solid var(--brass); padding: .1rem .45rem; border-radius: 2px; }
	main { max-width: 58rem; margin: 0 auto; padding: 2rem 1.5rem 3rem; }
	h1, h2 { font-family: Georgia, 'Times New Roman', serif; font-weight: 700; }
	h1 { font-size: 1.6rem; margin: 0 0 .4rem; } h2 { font-size: 1.15rem; margin: 0 0 .8rem; }
	a { color: var(--brass-deep); }
	.grid { display: grid; grid-template-columns: 1fr 1fr; gap: 1.5rem; }
	@media (max-width: 44rem) { .grid { grid-template-columns: 1fr; } }
	.sheet { background: var(--sheet); border: 1px solid var(--rule); border-top: 4px solid var(--brass);
		padding: 1.4rem 1.5rem; }
	table { width: 100%; border-collapse: collapse; }
	th, td { text-align: left; padding: .45rem 0; border-bottom: 1px solid var(--rule); vertical-align: top; }
	th { font-weight: 500; color: var(--muted); }
	td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
	tr.total td, tr.total th { border-bottom: 0; border-top: 2px solid var(--ink); font-weight: 700; color: var(--ink); }
	label { display: block; font-size: .85rem; color: var(--muted); margin: .8rem 0 .25rem; }
	input { width: 100%; font: inherit; padding: .55rem .65rem; border: 1px solid var(--rule);
		background: #fffdf6; color: var(--ink); border-radius: 3px; }
	input:focus { outline: 2px solid var(--brass); outline-offset: 1px; }
	.row { display: grid; grid-template-columns: 1fr 1fr; gap: .75rem; }
	button { font: 600 1rem/1 system-ui, sans-serif; border: 0; border-radius: 3px; cursor: pointer;
		padding: .8rem 1.1rem; background: var(--brass); color: #fffaf0; }
	button:hover { background: var(--brass-deep); }
	button.wide { width: 100%; margin-top: 1.2rem; }
	button.quiet { background: transparent; color: var(--alarm); border: 1px solid var(--alarm); }
	.note { color: var(--muted); font-size: .85rem; }
	.alert { border-left: 4px solid var(--alarm); background: #f7e3dc; padding: .7rem .9rem; margin-bottom: 1rem; }
	.ok { border-left: 4px solid var(--calm); background: #e6eedd; padding: .7rem .9rem; margin-bottom: 1rem; }
	.test { background: #efe2c2; border: 1px dashed var(--brass); padding: .6rem .8rem; font-size: .85rem; margin-top: 1.2rem; }
	code { font-family: ui-monospace, 'SFMono-Regular', Menlo, monospace; font-size: .9em; }
	.badge { font-size: .75rem; text-transform: uppercase; letter-spacing: .08em; padding: .1rem .45rem;
		border-radius: 2px; border: 1px solid currentColor; }
	.badge.active { color: var(--calm); } .badge.past_due, .badge.open { color: var(--alarm); }
	.badge.canceled { color: var(--muted); } .badge.paid { color: var(--calm); }
	.inline { display: flex; gap: .6rem; align-items: end; margin-top: .6rem; }
	.inline input { width: 7rem; }
	main > section + section { margin-top: 1.5rem; }
`;

function layout(title: string, body: string): string {
	return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${e(title)}</title><style>${style}</style></head>
<body><header><div><span class="mark">Pincer</span><span class="tag">Test payments</span></div></header>
<main>${body}</main></body></html>`;
}

const TEST_CARDS = `<div class="test"><strong>Test mode</strong> — no money moves.
	Pay with <code>4242 4242 4242 4242</code>; see a decline with <code>4000 0000 0000 0002</code>.
	Any future expiry and any 3-digit CVC.</div>`;

export type CheckoutView = {
	session: CheckoutSession;
	productName: string;
	seats: number;
	unitAmount: number;
	currency: string;
	total: number;
	payingAs: string | null;
	askEmail: boolean;
	error?: string;
	values?: { expiry?: string; cardholder?: string; email?: string };
};

export function renderCheckout(v: CheckoutView): string {
	const money = (amount: number) => formatMoney(amount, v.currency);
	const cancel = v.session.cancelUrl
		? `<p><a href="${e(v.session.cancelUrl)}">← Cancel and return to Pincer</a></p>`
		: '';
	const values = v.values ?? {};
	return layout(
		'Subscribe to Pincer',
		`${cancel}
		<div class="grid">
			<section class="sheet">
				<h1>Subscribe to Pincer</h1>
				<p class="note">Billed monthly${v.payingAs ? ` to ${e(v.payingAs)}` : ''}. Change seats or cancel any time.</p>
				<table>
					<tr><th>Plan</th><td class="num">${e(v.productName)}</td></tr>
					<tr><th>Seats</th><td class="num" id="seats">${v.seats}</td></tr>
					<tr><th>Price per seat</th><td class="num" id="unit">${money(v.unitAmount)} / month</td></tr>
					<tr class="total"><th>Total per month</th><td class="num" id="total">${money(v.total)}</td></tr>
				</table>
			</section>
			<section class="sheet">
				<h2>Card details</h2>
				${v.error ? `<div class="alert" role="alert">${e(v.error)}</div>` : ''}
				<form method="post" action="/pay/${e(v.session.id)}" autocomplete="off">
					${
						v.askEmail
							? `<label for="email">Email for receipts</label>
					<input id="email" name="email" type="email" required value="${e(values.email ?? '')}">`
							: ''
					}
					<label for="card_number">Card number</label>
					<input id="card_number" name="card_number" inputmode="numeric" placeholder="4242 4242 4242 4242" required>
					<div class="row">
						<div><label for="expiry">Expiry (MM / YY)</label>
						<input id="expiry" name="expiry" placeholder="MM / YY" required value="${e(values.expiry ?? '')}"></div>
						<div><label for="cvc">CVC</label>
						<input id="cvc" name="cvc" inputmode="numeric" placeholder="123" required></div>
					</div>
					<label for="cardholder">Name on card</label>
					<input id="cardholder" name="cardholder" value="${e(values.cardholder ?? '')}">
					<button class="wide" type="submit">Pay ${money(v.total)}</button>
				</form>
				${TEST_CARDS}
			</section>
		</div>`
	);
}

export function renderCheckoutClosed(session: CheckoutSession, status: string): string {
	const done = status === 'complete';
	const back = done ? session.successUrl : session.cancelUrl;
	return layout(
		done ? 'Already paid' : 'Checkout expired',
		`<section class="sheet"><h1>${done ? 'This checkout is already paid' : 'This checkout has expired'}</h1>
		<p>${done ? 'Nothing more to do here; your subscription is active.' : 'Start again from Pincer to get a fresh checkout.'}</p>
		${back ? `<p><a href="${e(back.replaceAll('{CHECKOUT_SESSION_ID}', session.id))}">Return to Pincer</a></p>` : ''}</section>`
	);
}

export type PortalView = {
	portalId: string;
	customer: Customer;
	returnUrl: string | null;
	subscriptions: {
		sub: Subscription;
		productName: string;
		seats: number;
		unitAmount: number;
		monthly: number;
		currency: string;
	}[];
	invoices: { invoice: Invoice; total: number }[];
	notice?: { kind: 'ok' | 'alert'; text: string };
};

function subscriptionCard(v: PortalView, s: PortalView['subscriptions'][number]): string {
	const money = (amount: number) => formatMoney(amount, s.currency);
	const { sub } = s;
	const live = sub.status !== 'canceled';
	const when =
		sub.status === 'canceled'
			? `Ended ${formatDate(sub.endedAt ?? sub.canceledAt ?? sub.periodEnd)}`
			: sub.cancelAtPeriodEnd
				? `Ends ${formatDate(sub.periodEnd)}`
				: sub.status === 'past_due'
					? 'The last payment failed; we will retry the card.'
					: `Renews ${formatDate(sub.periodEnd)}`;
	const action = `/portal/${e(v.portalId)}/subscriptions/${e(sub.id)}`;
	return `<section class="sheet">
		<h2>${e(s.productName)} <span class="badge ${e(sub.status)}">${e(sub.status.replace('_', ' '))}</span></h2>
		<table>
			<tr><th>Seats</th><td class="num">${s.seats}</td></tr>
			<tr><th>Price per seat</th><td class="num">${money(s.unitAmount)} / month</td></tr>
			<tr class="total"><th>Per month</th><td class="num">${money(s.monthly)}</td></tr>
		</table>
		<p class="note">${when}</p>
		${
			live
				? `<form method="post" action="${action}/seats" class="inline">
				<div><label for="q-${e(sub.id)}">Seats</label>
				<input id="q-${e(sub.id)}" name="quantity" type="number" min="1" max="10000" value="${s.seats}" required></div>
				<button type="submit">Update seats</button>
			</form>
			<form method="post" action="${action}/cancel" class="inline">
				<button type="submit" class="quiet">Cancel subscription</button>
			</form>`
				: ''
		}
	</section>`;
}

export function renderPortal(v: PortalView): string {
	const rows = v.invoices
		.map(
			({ invoice, total }) => `<tr><td>${formatDate(invoice.created)}</td>
			<td><a href="/invoice/${e(invoice.id)}">${e(invoice.number)}</a></td>
			<td><span class="badge ${e(invoice.status)}">${e(invoice.status)}</span></td>
			<td class="num">${formatMoney(total, invoice.currency)}</td></tr>`
		)
		.join('');
	return layout(
		'Billing',
		`${v.returnUrl ? `<p><a href="${e(v.returnUrl)}">← Return to Pincer</a></p>` : ''}
		<h1>Billing</h1>
		<p class="note">${e(v.customer.name ?? v.customer.email ?? v.customer.id)}</p>
		${v.notice ? `<div class="${v.notice.kind}" role="status">${e(v.notice.text)}</div>` : ''}
		${v.subscriptions.length ? v.subscriptions.map((s) => subscriptionCard(v, s)).join('') : '<section class="sheet"><p>No subscriptions yet.</p></section>'}
		<section class="sheet"><h2>Invoices</h2>
		${rows ? `<table><tr><th>Date</th><th>Number</th><th>Status</th><th class="num">Amount</th></tr>${rows}</table>` : '<p class="note">No invoices yet.</p>'}
		</section>`
	);
}

export function renderInvoicePage(invoice: Invoice, customer: Customer | undefined): string {
	const money = (amount: number) => formatMoney(amount, invoice.currency);
	const total = invoice.lines.reduce((sum, l) => sum + l.amount, 0);
	const lines = invoice.lines
		.map((l) => `<tr><td>${e(l.description)}</td><td class="num">${money(l.amount)}</td></tr>`)
		.join('');
	return layout(
		`Invoice ${invoice.number}`,
		`<section class="sheet"><h1>Invoice ${e(invoice.number)}
		<span class="badge ${e(invoice.status)}">${e(invoice.status)}</span></h1>
		<p class="note">Issued ${formatDate(invoice.created)}${customer?.email ? ` to ${e(customer.email)}` : ''}</p>
		<table>${lines}<tr class="total"><th>Total</th><td class="num">${money(total)}</td></tr></table></section>`
	);
}

export function renderOverview(counts: Record<string, number>, recent: string[]): string {
	return layout(
		'Local Stripe fake',
		`<h1>Local Stripe fake</h1>
		<p class="note">Answers the Stripe SDK on this machine; state lives in memory until it stops.
		Test controls are JSON under <code>/_fake</code>.</p>
		<section class="sheet"><table>${Object.entries(counts)
			.map(([k, n]) => `<tr><th>${e(k)}</th><td class="num">${n}</td></tr>`)
			.join('')}</table></section>
		<section class="sheet"><h2>Recent events</h2>${
			recent.length
				? `<table>${recent.map((r) => `<tr><td><code>${e(r)}</code></td></tr>`).join('')}</table>`
				: '<p class="note">None yet.</p>'
		}</section>`
	);
}

export function renderMissing(what: string): string {
	return layout(
		'Not found',
		`<section class="sheet"><h1>Not found</h1><p>${e(what)}</p></section>`
	);
}
