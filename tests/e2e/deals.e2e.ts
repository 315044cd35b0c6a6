import { randomUUID } from 'node:crypto';
import ExcelJS from 'exceljs';
import * as formulajs from '@formulajs/formulajs';
import type { Browser } from 'playwright-core';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchBrowser } from '../support/browser';
import { requireEnv } from '../support/db';
import { NewDealPage } from './pages/deals';
import { demo, postForm, signedIn } from './pages/session';

async function xlsx(rows: (string | number | Date | { formula: string })[][]): Promise<Buffer> {
	const book = new ExcelJS.Workbook();
	const sheet = book.addWorksheet('Flows');
	for (const row of rows) sheet.addRow(row);
	return Buffer.from(await book.xlsx.writeBuffer());
}

describe('deals', () => {
	let browser: Browser;
	let sql: postgres.Sql;
	beforeAll(async () => {
		browser = await launchBrowser();
		sql = postgres(requireEnv('PINCER_E2E_DATABASE_URL'), { max: 2, onnotice: () => {} });
	});
	afterAll(async () => {
		await browser?.close();
		await sql?.end();
	});
	const tag = () => randomUUID().slice(0, 6);

	it('shows both rates of the pump project: 25% and 400% (Lorie and Savage, 1955)', async () => {
		const { context, page } = await signedIn(browser, demo('analyst'));
		await new NewDealPage(page).create(
			`Pump ${tag()}`,
			'periodic',
			'0\t-1600\n1\t10000\n2\t-10000'
		);
		await page.getByTestId('several-rates').waitFor();
		const rates = await page.getByTestId('rate-row').allTextContents();
		expect(rates).toHaveLength(2);
		expect(rates[0]).toContain('25.000000%');
		expect(rates[1]).toContain('400.000000%');
		await context.close();
	});

	it('says plainly that 1000, −3000, 2500 has no rate (Brealey and Myers)', async () => {
		const { context, page } = await signedIn(browser, demo('analyst'));
		await new NewDealPage(page).create(
			`No rate ${tag()}`,
			'periodic',
			'0\t1000\n1\t-3000\n2\t2500'
		);
		const text = await page.getByTestId('no-rate').textContent();
		expect(text).toContain('No rate exists');
		expect(text).toContain('smallest magnitude');
		await expect(page.getByTestId('rate-row').count()).resolves.toBe(0);
		await context.close();
	});

	it('reads an uploaded xlsx of dated flows and agrees with an independent dated IRR to 1e-9', async () => {
		const { context, page } = await signedIn(browser, demo('analyst'));
		const dates = [
			'2026-01-15',
			'2026-04-02',
			'2026-09-30',
			'2027-03-31',
			'2027-12-20',
			'2028-06-30'
		];
		const amounts = [-250000, 18000, 42000, 61000, 75000, 98000];
		const file = await xlsx([
			['Date', 'Amount', 'Note'],
			...dates.map((d, i) => [new Date(`${d}T00:00:00Z`), amounts[i], i ? 'receipt' : 'purchase'])
		]);
		const deals = new NewDealPage(page);
		const name = `Upload ${tag()}`;
		await deals.upload(name, {
			name: 'flows.xlsx',
			mimeType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
			buffer: file
		});
		await page.getByRole('button', { name: 'Check every row' }).click();
		await expect(page.getByTestId('upload-ready').textContent()).resolves.toBe(
			'6 flows read without a problem.'
		);
		await page.getByRole('button', { name: 'Create the deal from this file' }).click();
		await page.waitForURL(/\/app\/deals\/[0-9a-f-]{36}$/);
		const dealId = new URL(page.url()).pathname.split('/').at(-1)!;
		const [stored] =
			await sql`select s.rate from deals d join solves s on s.id = d.last_solve_id where d.id = ${dealId}`;
		// Independent oracle: @formulajs/formulajs's dated IRR (act/365), float64.
		const oracle = formulajs.XIRR(
			amounts,
			dates.map((d) => new Date(`${d}T00:00:00Z`)),
			0.1
		) as number;
		expect(Math.abs(Number(stored.rate) - oracle)).toBeLessThan(1e-9);
		const [kept] = await sql`select file_name, size from deal_files where deal_id = ${dealId}`;
		expect(kept.file_name).toBe('flows.xlsx');
		expect(kept.size).toBe(file.length);

		const download = await context.request.get(`${inject('baseURL')}/app/deals/${dealId}/export`);
		const book = new ExcelJS.Workbook();
		await book.xlsx.load((await download.body()) as unknown as ArrayBuffer);
		expect(book.worksheets.map((s) => s.name)).toEqual([
			'Flows',
			'Results',
			'NPV profile',
			'Trace'
		]);
		const flows = book.getWorksheet('Flows')!;
		expect((flows.getRow(4).getCell(5).value as { formula: string }).formula).toBe(
			'(1+deal_rate)^(-C4)'
		);
		const total = flows.getRow(10).getCell(6).value as { formula: string; result: number };
		expect(total.formula).toBe('SUM(F4:F9)');
		expect(Math.abs(total.result)).toBeLessThan(1e-4);
		await context.close();
	});

	it('reports each bad upload with its row and changes nothing', async () => {
		const { context, page } = await signedIn(browser, demo('analyst'));
		const [{ before }] = await sql`select count(*)::int as before from deals`;
		const deals = new NewDealPage(page);
		const cases: [string, Buffer, string][] = [
			['text.csv', Buffer.from('Date,Amount\n2026-01-01,-1000\n2026-06-01,abc\n'), 'Row 3'],
			['dates.csv', Buffer.from('Date,Amount\n2026-01-01,-1000\n03/04/2026,600\n'), 'Row 3'],
			['empty.csv', Buffer.from(''), 'empty'],
			['nodate.csv', Buffer.from('When,Amount\nsoon,-1000\nlater,1100\n'), 'date'],
			[
				'formula.xlsx',
				await xlsx([
					['Date', 'Amount'],
					[new Date('2026-01-01T00:00:00Z'), -1000],
					[new Date('2027-01-01T00:00:00Z'), { formula: '1000*1.1' }]
				]),
				'formula'
			]
		];
		for (const [name, buffer, expected] of cases) {
			await deals.upload(`Bad ${tag()}`, {
				name,
				mimeType: name.endsWith('.csv')
					? 'text/csv'
					: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
				buffer
			});
			const check = page.getByRole('button', { name: 'Check every row' });
			await page.getByTestId('upload-problems').or(check).first().waitFor();
			if (await check.isVisible()) await check.click();
			const problems = await page.getByTestId('upload-problems').textContent();
			expect(problems, name).toContain(expected);
		}
		const [{ after }] = await sql`select count(*)::int as after from deals`;
		expect(after).toBe(before);
		await context.close();
	});

	it('copies a deal as a scenario and compares them side by side', async () => {
		const { context, page } = await signedIn(browser, demo('analyst'));
		const name = `Warehouse ${tag()}`;
		await new NewDealPage(page).create(
			name,
			'periodic',
			'0\t-100000\n1\t30000\n2\t30000\n3\t30000\n4\t30000'
		);
		await page.getByRole('button', { name: 'Copy as a scenario' }).click();
		await page.waitForURL(/\/app\/deals\/[0-9a-f-]{36}$/);
		await new NewDealPage(page).waitFresh();
		await page.getByLabel('Row 5 amount').fill('45000');
		await new NewDealPage(page).waitFresh();
		await page.getByRole('button', { name: 'Save as a new version' }).click();
		await page.getByText('Saved as version 2.').waitFor();
		await page.reload();
		const table = await page.getByTestId('scenario-table').textContent();
		expect(table).toContain(`${name} (base)`);
		expect(table).toContain(`${name} — scenario 1`);
		// Base: −100000 then 4 × 30000 → IRR 7.713847% (derived by hand from the annuity equation, checked to 6 decimals).
		expect(table).toContain('7.7138%');
		await context.close();
	});

	it('lets a reviewer read a deal but not change it; another workspace’s deal is 404', async () => {
		const [deal] =
			await sql`select d.id from deals d join workspaces w on w.id = d.workspace_id where w.slug = 'bramblecove' limit 1`;
		const { context, page } = await signedIn(browser, demo('reviewer'));
		expect((await page.goto(`${inject('baseURL')}/app/deals/${deal.id}`))?.status()).toBe(200);
		await expect(page.getByRole('button', { name: 'Save as a new version' }).count()).resolves.toBe(
			0
		);
		const [{ before }] =
			await sql`select count(*)::int as before from deal_versions where deal_id = ${deal.id}`;
		for (const action of ['save', 'scenario', 'email', 'importFile']) {
			expect(
				(
					await postForm(context, `/app/deals/${deal.id}?/${action}`, {
						name: 'x',
						content: '{}',
						to: 'x@example.test'
					})
				).status(),
				action
			).toBe(403);
		}
		const [{ after }] =
			await sql`select count(*)::int as after from deal_versions where deal_id = ${deal.id}`;
		expect(after).toBe(before);
		const [other] =
			await sql`insert into workspaces (name, slug) values ('Elsewhere Capital', ${`elsewhere-${randomUUID()}`}) returning id`;
		const [foreign] =
			await sql`insert into deals (workspace_id, name) values (${other.id}, 'Foreign deal') returning id`;
		const analyst = await signedIn(browser, demo('analyst'));
		expect(
			(await analyst.page.goto(`${inject('baseURL')}/app/deals/${foreign.id}`))?.status()
		).toBe(404);
		expect(
			(
				await analyst.context.request.get(`${inject('baseURL')}/app/deals/${foreign.id}/export`)
			).status()
		).toBe(404);
		await analyst.context.close();
		await context.close();
	});
});
