// Page objects shared by the end-to-end tests.
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { inject } from 'vitest';

export const DEMO_PASSWORD = 'pincer-demo-2026';
export const demo = (role: 'admin' | 'officer' | 'analyst' | 'reviewer') =>
	`${role}@bramblecove.example`;

export class SignInPage {
	constructor(readonly page: Page) {}

	async open(next?: string) {
		await this.page.goto(
			`${inject('baseURL')}/signin${next ? `?next=${encodeURIComponent(next)}` : ''}`
		);
	}

	async withPassword(email: string, password: string) {
		const form = this.page.locator('form[action^="?/password"]');
		await form.getByLabel('E-mail').fill(email);
		await form.getByLabel('Password').fill(password);
		await Promise.all([
			this.page.waitForLoadState('networkidle'),
			form.getByRole('button', { name: 'Sign in' }).click()
		]);
	}

	async askForLink(email: string) {
		const form = this.page.locator('form[action^="?/link"]');
		await form.getByLabel('E-mail me a one-time sign-in link').fill(email);
		await form.getByRole('button', { name: 'Send the link' }).click();
		await this.page.waitForURL('**/signin/check-email');
	}
}

/** A fresh browser context signed in as the given user. */
export async function signedIn(browser: Browser, email: string, password = DEMO_PASSWORD) {
	const context = await browser.newContext();
	const page = await context.newPage();
	const signIn = new SignInPage(page);
	await signIn.open();
	await signIn.withPassword(email, password);
	await page.waitForURL('**/app');
	return { context, page };
}

/** POSTs a form the way a browser would (same origin), with the context's cookies. */
export async function postForm(
	context: BrowserContext,
	path: string,
	fields: Record<string, string>
) {
	const base = inject('baseURL');
	return context.request.post(`${base}${path}`, {
		form: fields,
		headers: { origin: base, accept: 'text/html' },
		maxRedirects: 0
	});
}
