import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchBrowser } from '../support/browser';

describe('landing page', () => {
	let browser: Browser;
	beforeAll(async () => {
		browser = await launchBrowser();
	});
	afterAll(async () => {
		await browser?.close();
	});

	it('renders with our own fonts and requests nothing from any other host', async () => {
		const baseURL = inject('baseURL');
		const page = await browser.newPage();
		const requested: string[] = [];
		page.on('request', (request) => requested.push(request.url()));
		await page.goto(`${baseURL}/`, { waitUntil: 'networkidle' });

		await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toContain(
			'A rate you can defend'
		);
		const fonts = await page.evaluate(async () => {
			await document.fonts.ready;
			return {
				sans: document.fonts.check('16px Inter'),
				mono: document.fonts.check('16px "Roboto Mono"'),
				loaded: [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family)
			};
		});
		expect(fonts.sans).toBe(true);
		expect(fonts.mono).toBe(true);
		expect(fonts.loaded).toEqual(expect.arrayContaining(['Inter', 'Roboto Mono']));

		expect(requested.length).toBeGreaterThan(1);
		const hosts = new Set(requested.map((url) => new URL(url).host));
		expect([...hosts]).toEqual([new URL(baseURL).host]);
		expect(requested.some((url) => url.endsWith('.woff2'))).toBe(true);
		await page.close();
	});

	it('shows a request id on a server error page and a plain 404 page', async () => {
		const baseURL = inject('baseURL');
		const page = await browser.newPage();
		const response = await page.goto(`${baseURL}/no-such-page`);
		expect(response?.status()).toBe(404);
		await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(
			'Nothing here'
		);
		await page.close();
	});
});
