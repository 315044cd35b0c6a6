import type { Page } from 'playwright-core';
import { inject } from 'vitest';

export class NewDealPage {
	constructor(readonly page: Page) {}

	async create(name: string, mode: 'dated' | 'periodic', rows: string) {
		await this.page.goto(`${inject('baseURL')}/app/deals/new`);
		await this.page.getByLabel('Deal name').fill(name);
		await this.page.locator('select[name=mode]').selectOption(mode);
		await this.page.locator('textarea[name=rows]').fill(rows);
		await this.page.getByRole('button', { name: 'Create and solve' }).click();
		await this.page.waitForURL(/\/app\/deals\/[0-9a-f-]{36}$/);
		await this.waitFresh();
		return new URL(this.page.url()).pathname.split('/').at(-1)!;
	}

	async upload(name: string, file: { name: string; mimeType: string; buffer: Buffer }) {
		await this.page.goto(`${inject('baseURL')}/app/deals/new`);
		await this.page.getByRole('tab', { name: 'Upload a file' }).click();
		await this.page.getByLabel('Deal name').fill(name);
		await this.page.getByLabel('CSV or xlsx file').setInputFiles(file);
	}

	async waitFresh() {
		await this.page.getByTestId('freshness').filter({ hasText: 'up to date' }).waitFor();
	}
}
