import type { Page } from 'playwright-core';
import { inject } from 'vitest';

/** The 12 CFR 1026 Appendix J (b)(9) loan as spreadsheet rows: $1,000 then 36 × $33.61 monthly. */
export function appendixJExampleRows(start = '2026-01-10'): string {
	const [y, m, d] = start.split('-').map(Number);
	const lines = [`${start}\t1000.00`];
	for (let k = 1; k <= 36; k++) {
		const index = y * 12 + (m - 1) + k;
		lines.push(
			`${Math.floor(index / 12)}-${String((index % 12) + 1).padStart(2, '0')}-${String(d).padStart(2, '0')}\t33.61`
		);
	}
	return lines.join('\n');
}

export class NewLoanPage {
	constructor(readonly page: Page) {}

	async openScheduleEntry() {
		await this.page.goto(`${inject('baseURL')}/app/loans/new?mode=schedule`);
	}

	async openTerms() {
		await this.page.goto(`${inject('baseURL')}/app/loans/new`);
	}

	/** The main form of the page (not the file import below it). */
	form() {
		return this.page.locator('form[action^="?/terms"], form[action^="?/entry"]');
	}

	async fillHeader(reference: string, borrower: string) {
		await this.form().getByLabel('Reference').fill(reference);
		await this.form().getByLabel('Borrower').fill(borrower);
	}

	async fillTerms(terms: Record<string, string>) {
		for (const [label, value] of Object.entries(terms))
			await this.page.getByLabel(label, { exact: true }).fill(value);
	}

	async submit() {
		await this.page.getByRole('button', { name: 'Create and solve' }).click();
	}

	async submitAndOpen() {
		await this.submit();
		await this.page.waitForURL(/\/app\/loans\/[0-9a-f-]{36}$/);
		return new URL(this.page.url()).pathname.split('/').at(-1)!;
	}
}

export class LoanPage {
	constructor(readonly page: Page) {}

	disclosedRate() {
		return this.page.getByTestId('disclosed-rate').textContent();
	}

	async checkTolerance(apr: string, financeCharge = '') {
		const form = this.page.locator('form[action="?/check"]');
		await form.getByLabel('APR you intend to disclose (%)').fill(apr);
		await form.getByLabel('Finance charge to disclose (optional)').fill(financeCharge);
		await form.getByRole('button', { name: 'Check' }).click();
		await this.page.getByTestId('tolerance-result').getByText(`APR ${apr}%`).waitFor();
		return this.page.getByTestId('tolerance-result').textContent();
	}
}
