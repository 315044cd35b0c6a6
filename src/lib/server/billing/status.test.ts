import { describe, expect, it } from 'vitest';
import { readOnlyMessage, readOnlyReason } from './status';

const at = (iso: string) => new Date(iso);
const standing = (subscriptionStatus: string, trialEndsAt: Date | null = null) => ({
	name: 'Quillwort Savings',
	subscriptionStatus,
	trialEndsAt
});

describe('read-only workspaces', () => {
	const now = at('2026-06-15T12:00:00Z');

	it('lets paying, overdue and trial workspaces write', () => {
		expect(readOnlyReason(standing('active'), now)).toBeNull();
		expect(readOnlyReason(standing('past_due'), now)).toBeNull();
		expect(readOnlyReason(standing('trialing', at('2026-06-20T00:00:00Z')), now)).toBeNull();
		expect(readOnlyReason(standing('trialing', null), now)).toBeNull();
	});

	it('turns a canceled or unpaid subscription read-only', () => {
		expect(readOnlyReason(standing('canceled'), now)).toBe('ended');
		expect(readOnlyReason(standing('unpaid'), now)).toBe('ended');
	});

	it('turns a trial read-only from the moment it ends', () => {
		expect(readOnlyReason(standing('trialing', now), now)).toBe('trial-over');
		expect(readOnlyReason(standing('trialing', at('2026-06-01T00:00:00Z')), now)).toBe(
			'trial-over'
		);
	});

	it('says why and what still works', () => {
		const text = readOnlyMessage(standing('canceled'), 'ended');
		expect(text).toContain('Quillwort Savings is read-only');
		expect(text).toContain('canceled');
		expect(text).toContain('readable and exportable');
		expect(text).toContain('Billing and seats');
	});
});
