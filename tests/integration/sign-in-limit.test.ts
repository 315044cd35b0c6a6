import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import {
	attemptAllowed,
	MAX_FAILURES,
	recordAttempt,
	WINDOW_MINUTES
} from '$lib/server/auth/rate-limit';

const email = () => `limit-${randomUUID().slice(0, 8)}@example.test`;
const ip = () =>
	`10.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`;

describe('failed sign-in limit (counted in PostgreSQL)', () => {
	it('allows four failures and locks after the fifth, per e-mail, until 15 minutes after the first', async () => {
		const who = email();
		const started = Date.now();
		for (let i = 0; i < MAX_FAILURES - 1; i++) await recordAttempt('password', who, ip(), false);
		expect(await attemptAllowed('password', who, ip())).toEqual({ allowed: true });
		await recordAttempt('password', who, ip(), false);
		const verdict = await attemptAllowed('password', who, ip());
		expect(verdict.allowed).toBe(false);
		if (verdict.allowed) return;
		const lockMs = verdict.retryAt.getTime() - started;
		expect(lockMs).toBeGreaterThan(WINDOW_MINUTES * 60_000 - 5_000);
		expect(lockMs).toBeLessThan(WINDOW_MINUTES * 60_000 + 5_000);
	});

	it('locks an IP address after five failures spread over different e-mails', async () => {
		const address = ip();
		for (let i = 0; i < MAX_FAILURES; i++) await recordAttempt('password', email(), address, false);
		expect((await attemptAllowed('password', email(), address)).allowed).toBe(false);
		expect((await attemptAllowed('password', email(), ip())).allowed).toBe(true);
	});

	it('does not count successful sign-ins', async () => {
		const who = email();
		for (let i = 0; i < 8; i++) await recordAttempt('password', who, ip(), true);
		expect((await attemptAllowed('password', who, ip())).allowed).toBe(true);
	});
});
