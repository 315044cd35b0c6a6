// Page objects for sign-up, the local Stripe fake's hosted checkout and the billing page.
import type { Page } from 'playwright-core';
import { inject } from 'vitest';

export const APPROVED_CARD = '4242 4242 4242 4242';
export const DECLINED_CARD = '4000 0000 0000 0002';

export type Founder = {
	name: string;
	email: string;
	workspace: string;
	password: string;
	seats: number;
};

export class SignUpPage {
	constructor(readonly page: Page) {}

	async create(founder: Founder) {
		await this.page.goto(`${inject('baseURL')}/signup`);
		await this.page.getByLabel('Your name').fill(founder.name);
		await this.page.getByLabel('Work e-mail').fill(founder.email);
		await this.page.getByLabel('Workspace name').fill(founder.workspace);
		await this.page.getByLabel('Password').fill(founder.password);
		await this.page.getByLabel('Seats').fill(String(founder.seats));
		await this.page.getByRole('button', { name: 'Create the workspace and pay' }).click();
	}
}

/** The hosted checkout page served by fakes/stripe. */
export class CheckoutPage {
	constructor(readonly page: Page) {}

	async arrive() {
		await this.page.waitForURL(`${inject('stripeURL')}/pay/**`);
	}

	seats() {
		return this.page.locator('#seats').textContent();
	}

	async pay(card: string) {
		await this.page.getByLabel('Card number').fill(card);
		await this.page.getByLabel('Expiry (MM / YY)').fill('12 / 39');
		await this.page.getByLabel('CVC').fill('123');
		await this.page.getByLabel('Name on card').fill('Imogen Tarrant');
		await this.page.getByRole('button', { name: /^Pay / }).click();
	}

	alert() {
		return this.page.getByRole('alert').textContent();
	}

	async leave() {
		await this.page.getByRole('link', { name: /Cancel and return to Pincer/ }).click();
		await this.page.waitForURL(`${inject('baseURL')}/app/settings/billing?checkout=left`);
	}
}

export class BillingPage {
	constructor(readonly page: Page) {}

	async open() {
		return this.page.goto(`${inject('baseURL')}/app/settings/billing`);
	}

	async arriveFromCheckout() {
		await this.page.waitForURL(`${inject('baseURL')}/app/settings/billing?checkout=done*`);
	}

	status() {
		return this.page.getByTestId('billing-status').textContent();
	}

	seatsPaid() {
		return this.page.getByTestId('seats-paid').textContent();
	}

	/** Waits until the page shows `seats` paid seats (it refreshes itself while Stripe confirms). */
	async waitForSeatsPaid(seats: number) {
		await this.page.getByTestId('seats-paid').getByText(String(seats), { exact: true }).waitFor();
	}

	async changeSeats(seats: number) {
		await this.page.getByLabel('Seats').fill(String(seats));
		await this.page.getByRole('button', { name: 'Change seats' }).click();
	}
}

/** Drives the Stripe fake's test controls (renewals, cancellation) as Stripe itself would act. */
export async function stripeControl(path: string, body: Record<string, unknown> = {}) {
	const res = await fetch(`${inject('stripeURL')}/_fake${path}`, {
		method: 'POST',
		headers: { 'content-type': 'application/json' },
		body: JSON.stringify(body)
	});
	if (!res.ok) throw new Error(`${path} answered ${res.status}: ${await res.text()}`);
	return res.json();
}
