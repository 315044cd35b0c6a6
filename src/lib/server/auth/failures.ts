import { eq } from 'drizzle-orm';
import { appendAuditEvent } from '../audit/chain';
import { db } from '../db';
import { users } from '../db/schema';
import { auditForUser } from './audit-user';

/** Audits a failed password sign-in: in the user's workspaces, or the global chain for unknown e-mails. */
export async function auditFailedSignIn(email: string, ip: string | null, reason: string) {
	const [user] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
	await db.transaction(async (tx) => {
		if (user) await auditForUser(tx, user.id, 'auth.signin.failed', { ip, reason });
		else
			await appendAuditEvent(tx, {
				workspaceId: null,
				actorId: null,
				action: 'auth.signin.failed',
				subject: null,
				payload: { email, ip, reason }
			});
	});
}

/** Where to go after signing in: a path on this site only (no open redirects). */
export function safeNext(url: URL, fallback = '/app'): string {
	const next = url.searchParams.get('next') ?? '';
	return next.startsWith('/') && !next.startsWith('//') && !next.startsWith('/\\')
		? next
		: fallback;
}
