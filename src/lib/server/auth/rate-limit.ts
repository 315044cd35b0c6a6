import { and, count, eq, gt, min, or, sql } from 'drizzle-orm';
import { db } from '../db';
import { authAttempts } from '../db/schema';

export const WINDOW_MINUTES = 15;
export const MAX_FAILURES = 5;

type Kind = 'password' | 'link' | 'reset';

/**
 * Whether another attempt is allowed for this e-mail and IP. Password failures are counted;
 * for links and resets every request counts, so nobody can flood an inbox.
 */
export async function attemptAllowed(
	kind: Kind,
	email: string,
	ip: string | null
): Promise<{ allowed: true } | { allowed: false; retryAt: Date }> {
	const since = sql`now() - make_interval(mins => ${WINDOW_MINUTES})`;
	const who = ip
		? or(eq(authAttempts.email, email), eq(authAttempts.ip, ip))
		: eq(authAttempts.email, email);
	const counted = kind === 'password' ? eq(authAttempts.succeeded, false) : sql`true`;
	const rows = await db
		.select({
			email: authAttempts.email,
			ip: authAttempts.ip,
			n: count(),
			oldest: min(authAttempts.createdAt)
		})
		.from(authAttempts)
		.where(and(eq(authAttempts.kind, kind), who, counted, gt(authAttempts.createdAt, since)))
		.groupBy(authAttempts.email, authAttempts.ip);
	// Count per e-mail and per IP separately; either reaching the limit locks.
	const byEmail = rows.filter((r) => r.email === email);
	const byIp = ip ? rows.filter((r) => r.ip === ip) : [];
	for (const group of [byEmail, byIp]) {
		const n = group.reduce((sum, r) => sum + r.n, 0);
		if (n >= MAX_FAILURES) {
			const oldest = group.reduce<Date | null>(
				(o, r) => (r.oldest && (!o || r.oldest < o) ? r.oldest : o),
				null
			);
			const retryAt = new Date((oldest ?? new Date()).getTime() + WINDOW_MINUTES * 60_000);
			return { allowed: false, retryAt };
		}
	}
	return { allowed: true };
}

export async function recordAttempt(
	kind: Kind,
	email: string,
	ip: string | null,
	succeeded: boolean
) {
	await db.insert(authAttempts).values({ kind, email, ip, succeeded });
}

/** "Try again after 20:15 UTC (in 12 minutes)." */
export function retryMessage(retryAt: Date): string {
	const minutes = Math.max(1, Math.ceil((retryAt.getTime() - Date.now()) / 60_000));
	const clock = retryAt.toISOString().slice(11, 16);
	return `Too many attempts. Try again after ${clock} UTC (in ${minutes} minute${minutes === 1 ? '' : 's'}).`;
}
