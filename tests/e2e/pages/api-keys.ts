// Page object of Settings → API keys.
import type { Page } from 'playwright-core';
import { inject } from 'vitest';

export class ApiKeysPage {
	constructor(readonly page: Page) {}

	async open() {
		return this.page.goto(`${inject('baseURL')}/app/settings/api-keys`);
	}

	/** Creates a key and returns it as the page shows it, once. */
	async create(name: string, scope: 'officer' | 'analyst' | 'reviewer'): Promise<string> {
		await this.page.getByLabel('Name').fill(name);
		await this.page.getByLabel('Scope').selectOption(scope);
		await this.page.getByRole('button', { name: 'Create key' }).click();
		const shown = this.page.getByTestId('new-key');
		await shown.waitFor();
		return (await shown.textContent())?.trim() ?? '';
	}

	row(name: string) {
		return this.page.getByTestId('api-key-row').filter({ hasText: name });
	}

	async revoke(name: string) {
		await this.page.getByRole('button', { name: `Revoke ${name}` }).click();
		await this.row(name).getByText('revoked').waitFor();
	}
}
