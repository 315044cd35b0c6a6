import { randomUUID } from 'node:crypto';
import ExcelJS from 'exceljs';
import type { Browser } from 'playwright-core';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchBrowser } from '../support/browser';
import { requireEnv } from '../support/db';
import { waitForMail } from './pages/inbox';
import { appendixJExampleRows, LoanPage, NewLoanPage } from './pages/loans';
import { demo, postForm, signedIn } from './pages/session';

describe('loan files', () => {
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
	const tag = () => randomUUID().slice(0, 6).toUpperCase();

	it('discloses 12.83% for the Appendix J (b)(9) loan entered as pasted rows, exports it and e-mails it', async () => {
		// 12 CFR 1026 Appendix J (b)(9): $1,000 repaid by 36 monthly payments of $33.61 → APR 12.83%.
		const { context, page } = await signedIn(browser, demo('officer'));
		const form = new NewLoanPage(page);
		await form.openScheduleEntry();
		const reference = `APPJ-B9-${tag()}`;
		await form.fillHeader(reference, 'Example borrower');
		await page.getByLabel('Paste rows from a spreadsheet').fill(appendixJExampleRows());
		const loanId = await form.submitAndOpen();
		const loan = new LoanPage(page);
		await expect(loan.disclosedRate()).resolves.toBe('12.83%');
		await expect(page.getByTestId('amount-financed').textContent()).resolves.toBe('$1,000.00');
		await expect(page.getByTestId('total-of-payments').textContent()).resolves.toBe('$1,209.96');
		await expect(page.getByTestId('finance-charge').textContent()).resolves.toBe('$209.96');
		await expect(page.getByTestId('caution').count()).resolves.toBe(1);

		const download = await context.request.get(`${inject('baseURL')}/app/loans/${loanId}/export`);
		expect(download.status()).toBe(200);
		const book = new ExcelJS.Workbook();
		await book.xlsx.load((await download.body()) as unknown as ArrayBuffer);
		expect(book.worksheets.map((s) => s.name)).toEqual([
			'Terms',
			'Schedule',
			'Disclosure',
			'Trace'
		]);
		const schedule = book.getWorksheet('Schedule')!;
		const firstPayment = schedule.getRow(6);
		expect(firstPayment.getCell(2).value).toBe('payment');
		expect((firstPayment.getCell(7).value as { formula: string }).formula).toBe(
			'1/((1+F6*solved_rate)*(1+solved_rate)^E6)'
		);
		expect((firstPayment.getCell(8).value as { formula: string }).formula).toBe('D6*G6');
		const total = schedule.getRow(5 + 37).getCell(8).value as { formula: string; result: number };
		expect(total.formula).toBe('SUM(H5:H41)');
		expect(Math.abs(total.result)).toBeLessThan(1e-6);
		const disclosure = book.getWorksheet('Disclosure')!;
		expect(disclosure.getRow(4).getCell(2).value).toBe('12.83');
		expect(String(disclosure.getRow(12).getCell(2).value)).toContain('not legal advice');

		const to = `examiner-${tag().toLowerCase()}@example.test`;
		await page.getByLabel('E-mail the disclosure with the workbook to').fill(to);
		await page.getByRole('button', { name: 'Send' }).click();
		const mail = await waitForMail(to, new RegExp(`Disclosure for loan ${reference}`));
		expect(mail.text).toContain('Annual percentage rate: 12.83%');
		expect(mail.text).toContain('not legal advice');
		expect(mail.attachments.map((a) => a.filename)).toEqual([`pincer-loan-${reference}-v1.xlsx`]);
		await context.close();
	});

	it('builds the schedule from terms with an odd first period and a financed fee', async () => {
		const { context, page } = await signedIn(browser, demo('officer'));
		const form = new NewLoanPage(page);
		await form.openTerms();
		await form.fillHeader(`ODD-${tag()}`, 'Juniper Ashdown');
		await form.fillTerms({
			'Amount of credit': '5,000.00',
			'Note rate (% per year)': '9.5',
			'Number of payments': '24',
			'Date of the advance': '2026-03-04',
			'First payment date': '2026-04-20'
		});
		await page.getByLabel('Fee 1 name').fill('Origination');
		await page.getByLabel('Fee 1 amount').fill('100');
		await page.getByLabel('Fee 1 kind').selectOption('finance-charge-financed');
		await form.submitAndOpen();
		// Amount financed = 5,000 + 100 financed − 100 prepaid finance charge (12 CFR 1026.18(b)).
		await expect(page.getByTestId('amount-financed').textContent()).resolves.toBe('$5,000.00');
		await expect(page.getByText('f = 16/30 (an odd first period').count()).resolves.toBe(1);
		const rate = (await new LoanPage(page).disclosedRate()) ?? '';
		// The fee financed on top of a 9.5% note puts the APR above the note rate (derived by hand: ~10.5%).
		expect(Number(rate.replace('%', ''))).toBeGreaterThan(9.5);
		expect(Number(rate.replace('%', ''))).toBeLessThan(11.5);
		await context.close();
	});

	it('checks a disclosed APR on both sides of the 1/8-point boundary', async () => {
		// 12 CFR 1026 Supplement I, comment 22(a)(2)-1: exact APR 10 1/8% → disclosures from 10% to 10 1/4% are accurate.
		// $1,000 advanced, $1,101.25 repaid one year later: the term is the unit period, APR exactly 10.125%.
		const { context, page } = await signedIn(browser, demo('officer'));
		const form = new NewLoanPage(page);
		await form.openScheduleEntry();
		await form.fillHeader(`TOL-${tag()}`, 'Boundary case');
		await page
			.getByLabel('Paste rows from a spreadsheet')
			.fill('2026-01-15\t1000.00\n2027-01-15\t1101.25');
		await form.submitAndOpen();
		const loan = new LoanPage(page);
		await expect(loan.disclosedRate()).resolves.toBe('10.13%');
		expect(await loan.checkTolerance('10.00')).toContain('APR 10.00%: accurate');
		expect(await loan.checkTolerance('10.25')).toContain('APR 10.25%: accurate');
		expect(await loan.checkTolerance('10.26')).toContain('APR 10.26%: NOT accurate');
		expect(await loan.checkTolerance('9.99')).toContain('APR 9.99%: NOT accurate');

		await page.goto(`${inject('baseURL')}/app`);
		await expect(page.getByTestId('alert').first().textContent()).resolves.toContain('9.99%');
		await context.close();
	});

	it('answers each bad input with a field message and leaves the saved loan untouched', async () => {
		const { context, page } = await signedIn(browser, demo('officer'));
		const form = new NewLoanPage(page);
		const [{ before }] = await sql`select count(*)::int as before from loans`;
		const cases: [Record<string, string>, string][] = [
			[{ 'Amount of credit': '0' }, 'The amount of credit must be more than zero.'],
			[{ 'Amount of credit': '-500' }, 'The amount of credit must be an amount such as 1250.00'],
			[{ 'Note rate (% per year)': 'nine' }, 'The note rate is a percent per year such as 9.5'],
			[{ 'Number of payments': '0' }, 'A loan needs at least one payment.'],
			[
				{ 'First payment date': '2026-02-01' },
				'The first payment must fall after the date of the advance.'
			]
		];
		const good = {
			'Amount of credit': '1000',
			'Note rate (% per year)': '7',
			'Number of payments': '12',
			'Date of the advance': '2026-03-01',
			'First payment date': '2026-04-01'
		};
		for (const [change, message] of cases) {
			await form.openTerms();
			await form.fillHeader(`BAD-${tag()}`, 'Someone');
			await form.fillTerms({ ...good, ...change });
			await form.submit();
			await expect(page.getByText(message).first().textContent(), message).resolves.toContain(
				message
			);
			await expect(page.getByLabel('Borrower').inputValue()).resolves.toBe('Someone');
		}
		await form.openTerms();
		await form.fillHeader(`FEES-${tag()}`, 'Someone');
		await form.fillTerms(good);
		await page.getByLabel('Fee 1 amount').fill('1500');
		await form.submit();
		await page.getByText('The prepaid finance charges are as large as the credit itself').waitFor();

		await form.openScheduleEntry();
		await form.fillHeader(`NOREPAY-${tag()}`, 'Someone');
		await page.getByLabel('Paste rows from a spreadsheet').fill('2026-01-15\t1000.00\tadvance');
		await form.submit();
		await page.getByText('The schedule has no payment: a loan must be repaid.').waitFor();
		const [{ after }] = await sql`select count(*)::int as after from loans`;
		expect(after).toBe(before);
		await context.close();
	});

	it('imports a schedule from a CSV file, and names the bad row of a broken one', async () => {
		// 12 CFR 1026 Appendix J (b)(9) again, as a lender's file: the advance negative, payments positive.
		const { context, page } = await signedIn(browser, demo('officer'));
		const rows = appendixJExampleRows('2026-03-05')
			.split('\n')
			.map((line, i) =>
				(i === 0 ? line.replace('\t1000.00', '\t-1000.00') : line).replace('\t', ',')
			);
		const importFile = async (reference: string, csv: string) => {
			await page.goto(`${inject('baseURL')}/app/loans/new?mode=schedule`);
			await page.getByText('Or import the schedule from a CSV or xlsx file').click();
			const form = page.locator('form[action^="?/file"]');
			await form.getByLabel('Reference').fill(reference);
			await form.getByLabel('Borrower').fill('Imported borrower');
			await form
				.locator('input[type=file]')
				.setInputFiles({ name: 'schedule.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
			await form.getByRole('button', { name: 'Import and solve' }).click();
		};
		await importFile(`IMP-${tag()}`, ['Date,Amount', ...rows].join('\n'));
		await page.waitForURL(/\/app\/loans\/[0-9a-f-]{36}$/);
		await expect(new LoanPage(page).disclosedRate()).resolves.toBe('12.83%');

		const [{ before }] = await sql`select count(*)::int as before from loans`;
		await importFile(`IMPBAD-${tag()}`, 'Date,Amount\n2026-03-05,-1000\n2026-04-05,thirty\n');
		await expect(page.getByTestId('file-problems').textContent()).resolves.toContain('Row 3');
		const [{ after }] = await sql`select count(*)::int as after from loans`;
		expect(after).toBe(before);
		await context.close();
	});

	it('keeps versions: editing a disclosed loan creates version 2 and the history says what changed', async () => {
		const { context, page } = await signedIn(browser, demo('officer'));
		const form = new NewLoanPage(page);
		await form.openTerms();
		await form.fillHeader(`VER-${tag()}`, 'Versioned');
		await form.fillTerms({
			'Amount of credit': '2400',
			'Note rate (% per year)': '6',
			'Number of payments': '12',
			'Date of the advance': '2026-05-01',
			'First payment date': '2026-06-01'
		});
		const loanId = await form.submitAndOpen();
		await page.getByRole('button', { name: 'Mark as disclosed' }).click();
		await page.getByTestId('loan-status').filter({ hasText: 'disclosed (v1)' }).waitFor();
		await page.getByLabel('Note rate (% per year)').fill('6.5');
		await page.getByRole('button', { name: 'Save as a new version and solve' }).click();
		await page.getByText('Saved as version 2').waitFor();
		const versions =
			await sql`select version, changes, terms->'terms'->>'noteRate' as rate from loan_versions where loan_id = ${loanId} order by version`;
		expect(versions.map((v) => v.rate)).toEqual(['6', '6.5']);
		expect(versions[1].changes).toEqual(['note rate 6 → 6.5']);
		await page.reload();
		await expect(page.getByTestId('version-row').first().textContent()).resolves.toContain(
			'note rate 6 → 6.5'
		);
		await context.close();
	});

	it('lets a reviewer read a loan and its history but refuses every write; another workspace gets 404', async () => {
		const [loan] =
			await sql`select l.id from loans l join workspaces w on w.id = l.workspace_id where w.slug = 'bramblecove' limit 1`;
		const { context, page } = await signedIn(browser, demo('reviewer'));
		const res = await page.goto(`${inject('baseURL')}/app/loans/${loan.id}`);
		expect(res?.status()).toBe(200);
		await expect(page.getByText('Read-only for your role.').count()).resolves.toBe(1);
		await expect(
			page.getByRole('button', { name: 'Save as a new version and solve' }).count()
		).resolves.toBe(0);
		const [{ before }] =
			await sql`select count(*)::int as before from loan_versions where loan_id = ${loan.id}`;
		for (const action of ['terms', 'entry', 'check', 'disclose', 'email']) {
			const post = await postForm(context, `/app/loans/${loan.id}?/${action}`, {
				disclosedApr: '10',
				to: 'x@example.test'
			});
			expect(post.status(), action).toBe(403);
		}
		const [{ after }] =
			await sql`select count(*)::int as after from loan_versions where loan_id = ${loan.id}`;
		expect(after).toBe(before);

		const [other] =
			await sql`insert into workspaces (name, slug) values ('Elsewhere Credit', ${`elsewhere-${randomUUID()}`}) returning id`;
		const [foreign] =
			await sql`insert into loans (workspace_id, reference, borrower_name, regime) values (${other.id}, 'FOREIGN-1', 'Nobody', 'us-apr') returning id`;
		const officer = await signedIn(browser, demo('officer'));
		expect(
			(await officer.page.goto(`${inject('baseURL')}/app/loans/${foreign.id}`))?.status()
		).toBe(404);
		expect(
			(
				await officer.context.request.get(`${inject('baseURL')}/app/loans/${foreign.id}/export`)
			).status()
		).toBe(404);
		expect(
			(await postForm(officer.context, `/app/loans/${foreign.id}?/disclose`, {})).status()
		).toBe(404);
		await officer.context.close();
		await context.close();
	});
});
