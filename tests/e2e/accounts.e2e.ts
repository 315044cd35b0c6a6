import { randomUUID } from 'node:crypto';
import type { Browser } from 'playwright-core';
import postgres from 'postgres';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { launchBrowser } from '../support/browser';
import { requireEnv } from '../support/db';
import { linkIn, waitForMail } from './pages/inbox';
import { demo, postForm, signedIn, SignInPage } from './pages/session';

describe('accounts, roles and workspaces', () => {
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

	it('sends a signed-out visitor to the sign-in page, and back after signing in', async () => {
		const context = await browser.newContext();
		const page = await context.newPage();
		await page.goto(`${inject('baseURL')}/app/audit`);
		expect(new URL(page.url()).pathname).toBe('/signin');
		expect(new URL(page.url()).searchParams.get('next')).toBe('/app/audit');
		await new SignInPage(page).withPassword(demo('reviewer'), 'pincer-demo-2026');
		await page.waitForURL('**/app/audit');
		await expect(page.getByRole('heading', { level: 1 }).textContent()).resolves.toBe(
			'Audit trail'
		);
		await context.close();
	});

	it('answers a wrong password and an unknown e-mail with the same words, keeping the e-mail typed', async () => {
		const context = await browser.newContext();
		const page = await context.newPage();
		const signIn = new SignInPage(page);
		const answers: string[] = [];
		for (const email of [demo('analyst'), `nobody-${randomUUID().slice(0, 6)}@example.test`]) {
			await signIn.open();
			await signIn.withPassword(email, 'not-the-right-password');
			answers.push((await page.getByRole('alert').first().textContent()) ?? '');
			await expect(
				page.locator('form[action^="?/password"] input[name=email]').inputValue()
			).resolves.toBe(email);
			await expect(page.locator('input[name=password]').inputValue()).resolves.toBe('');
		}
		expect(answers[0]).toContain('do not match an account');
		expect(answers[1]).toBe(answers[0]);
		await context.close();
	});

	it('shows an officer only their screens and refuses the team page with 403', async () => {
		const { context, page } = await signedIn(browser, demo('officer'));
		await expect(page.getByTestId('role-badge').textContent()).resolves.toBe('loan officer');
		const nav = await page.getByRole('navigation', { name: 'Main' }).textContent();
		expect(nav).not.toContain('Team');
		expect(nav).not.toContain('Audit trail');
		const response = await page.goto(`${inject('baseURL')}/app/settings/team`);
		expect(response?.status()).toBe(403);
		await context.close();
	});

	it('refuses every write a reviewer attempts with 403 and changes nothing', async () => {
		const { context } = await signedIn(browser, demo('reviewer'));
		const [{ before }] = await sql`select count(*)::int as before from invitations`;
		const attempts = [
			['/app/settings/team?/invite', { email: 'x@example.test', role: 'analyst' }],
			['/app/settings/team?/role', { membershipId: randomUUID(), role: 'admin' }],
			['/app/settings/team?/remove', { membershipId: randomUUID() }]
		] as const;
		for (const [path, fields] of attempts) {
			const res = await postForm(context, path, fields);
			expect(res.status(), path).toBe(403);
		}
		const [{ after }] = await sql`select count(*)::int as after from invitations`;
		expect(after).toBe(before);
		await context.close();
	});

	it("treats another workspace's member or workspace id as not found (404)", async () => {
		const [other] =
			await sql`insert into workspaces (name, slug) values ('Elsewhere Savings', ${`elsewhere-${randomUUID()}`}) returning id`;
		const [stranger] =
			await sql`insert into users (email, name) values (${`stranger-${randomUUID().slice(0, 6)}@example.test`}, 'Stranger') returning id`;
		const [membership] =
			await sql`insert into memberships (workspace_id, user_id, role) values (${other.id}, ${stranger.id}, 'officer') returning id`;
		const { context } = await signedIn(browser, demo('admin'));
		expect(
			(
				await postForm(context, '/app/settings/team?/remove', { membershipId: membership.id })
			).status()
		).toBe(404);
		expect((await postForm(context, '/app/switch', { workspaceId: other.id })).status()).toBe(404);
		const [still] =
			await sql`select count(*)::int as n from memberships where id = ${membership.id}`;
		expect(still.n).toBe(1);
		await context.close();
	});

	it('signs in with the one-time link read from the local inbox; a second use is refused', async () => {
		const context = await browser.newContext();
		const page = await context.newPage();
		const signIn = new SignInPage(page);
		await signIn.open();
		await signIn.askForLink(demo('analyst'));
		const mail = await waitForMail(demo('analyst'), /sign-in link/);
		const link = linkIn(mail);
		await page.goto(link);
		await page.waitForURL('**/app');
		await expect(page.getByTestId('role-badge').textContent()).resolves.toBe('treasury analyst');

		const again = await (await browser.newContext()).newPage();
		await again.goto(link);
		expect(new URL(again.url()).pathname).toBe('/signin/problem');
		await expect(again.getByTestId('problem').textContent()).resolves.toContain(
			'expired or was used'
		);
		await context.close();
	});

	it('lets a newcomer sign up, invite a colleague, and the colleague join with the role from the invitation', async () => {
		const tag = randomUUID().slice(0, 8);
		const founder = `founder-${tag}@example.test`;
		const colleague = `colleague-${tag}@example.test`;
		const context = await browser.newContext();
		const page = await context.newPage();
		await page.goto(`${inject('baseURL')}/signup`);
		await page.getByLabel('Your name').fill('Imogen Tarrant');
		await page.getByLabel('Work e-mail').fill(founder);
		await page.getByLabel('Workspace name').fill(`Harrowgate Lending ${tag}`);
		await page.getByLabel('Password').fill('short');
		await page.getByRole('button', { name: 'Create the workspace' }).click();
		await expect(page.getByText('Use at least 12 characters.').textContent()).resolves.toBeTruthy();
		await expect(page.getByLabel('Work e-mail').inputValue()).resolves.toBe(founder);
		await page.getByLabel('Password').fill('a-sound-password-2026');
		await page.getByRole('button', { name: 'Create the workspace' }).click();
		// Sign-up goes on to checkout (the local Stripe fake); the workspace is on its trial meanwhile.
		await page.waitForURL(`${inject('stripeURL')}/pay/**`);
		await page.goto(`${inject('baseURL')}/app`);
		await expect(page.getByTestId('role-badge').textContent()).resolves.toBe('admin');

		await page.goto(`${inject('baseURL')}/app/settings/team`);
		await page.getByLabel('E-mail').fill(colleague);
		await page.getByLabel('Role', { exact: true }).selectOption('analyst');
		await page.getByRole('button', { name: 'Send invitation' }).click();
		await page.getByText(`Invitation sent to ${colleague}.`).waitFor();

		const mail = await waitForMail(colleague, /invited to Harrowgate Lending/);
		const invitee = await (await browser.newContext()).newPage();
		await invitee.goto(linkIn(mail));
		await expect(invitee.getByTestId('invited-role').textContent()).resolves.toBe('analyst');
		await invitee.getByLabel('Your name').fill('Rosalind Achterberg');
		await invitee.getByLabel('Choose a password').fill('another-sound-password');
		await invitee.getByLabel('The same again').fill('another-sound-password');
		await invitee.getByRole('button', { name: /^Join/ }).click();
		await invitee.waitForURL('**/app?joined=1');
		await expect(invitee.getByTestId('role-badge').textContent()).resolves.toBe('treasury analyst');

		const [row] = await sql`
			select m.role from memberships m join users u on u.id = m.user_id where u.email = ${colleague}`;
		expect(row.role).toBe('analyst');
		await invitee.goto(linkIn(mail));
		await expect(invitee.getByText('has been used already').count()).resolves.toBeGreaterThan(0);
		await context.close();
	});

	it('lets a reviewer check the chain: intact, with the number of events', async () => {
		const { context, page } = await signedIn(browser, demo('reviewer'));
		await page.goto(`${inject('baseURL')}/app/audit`);
		await page.getByRole('button', { name: 'Check the chain' }).click();
		await expect(page.getByTestId('chain-result').textContent()).resolves.toMatch(
			/Chain intact, \d+ events\./
		);
		const csv = await context.request.get(`${inject('baseURL')}/app/audit/export?format=csv`);
		expect(csv.status()).toBe(200);
		expect((await csv.text()).split('\r\n')[0]).toBe(
			'id,time_utc,actor_email,actor_name,action,subject,payload_json,hash'
		);
		await context.close();
	});
});
