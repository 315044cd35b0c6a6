// Forms of accounts, workspaces and members. Shared by form actions and the API reference.
import { z } from 'zod';
import { seatCount } from './billing';

export const email = z
	.string({ error: 'Enter your e-mail address.' })
	.trim()
	.toLowerCase()
	.pipe(z.email({ error: 'Enter an e-mail address such as name@example.com.' }))
	.describe('E-mail address');

export const newPassword = z
	.string({ error: 'Choose a password.' })
	.min(12, { error: 'Use at least 12 characters.' })
	.max(200, { error: 'Use at most 200 characters.' });

const personName = z
	.string()
	.trim()
	.min(1, { error: 'Enter your name.' })
	.max(120, { error: 'Use at most 120 characters.' });

export const signInSchema = z.object({
	email,
	password: z
		.string({ error: 'Enter your password.' })
		.min(1, { error: 'Enter your password.' })
		.max(200)
});

export const signInLinkSchema = z.object({ email });

export const signUpSchema = z.object({
	name: personName,
	email,
	workspace: z
		.string()
		.trim()
		.min(2, { error: 'Name your workspace (at least 2 characters).' })
		.max(120, { error: 'Use at most 120 characters.' }),
	password: newPassword,
	seats: seatCount.default(3)
});

export const forgotSchema = z.object({ email });

const confirmMatches = (d: { password: string; confirm: string }) => d.password === d.confirm;
const confirmIssue = { error: 'The two passwords differ.', path: ['confirm'] };

export const resetSchema = z
	.object({ password: newPassword, confirm: z.string() })
	.refine(confirmMatches, confirmIssue);

export const changePasswordSchema = z
	.object({
		current: z.string().min(1, { error: 'Enter your current password.' }),
		password: newPassword,
		confirm: z.string()
	})
	.refine(confirmMatches, confirmIssue);

export const acceptInvitationSchema = z
	.object({ name: personName, password: newPassword, confirm: z.string() })
	.refine(confirmMatches, confirmIssue);

export const invitableRoles = ['officer', 'analyst', 'reviewer'] as const;
export const allRoles = ['admin', 'officer', 'analyst', 'reviewer'] as const;

export const inviteSchema = z.object({
	email,
	role: z.enum(invitableRoles, { error: 'Pick a role: officer, analyst or reviewer.' })
});

export const memberRoleSchema = z.object({
	membershipId: z.uuid({ error: 'Unknown member.' }),
	role: z.enum(allRoles, { error: 'Pick a role.' })
});

export const memberSchema = z.object({ membershipId: z.uuid({ error: 'Unknown member.' }) });
export const invitationIdSchema = z.object({
	invitationId: z.uuid({ error: 'Unknown invitation.' })
});
export const switchWorkspaceSchema = z.object({
	workspaceId: z.uuid({ error: 'Unknown workspace.' })
});
