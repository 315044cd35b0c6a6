// Seeds the invented demo workspace once. Idempotent: each part checks whether it already
// exists and leaves existing rows (and anything users changed) alone.
import { hash } from '@node-rs/argon2';
import { eq } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import { appendAuditEvent } from '../src/lib/server/audit/chain.ts';
import * as schema from '../src/lib/server/db/schema/index.ts';
import { DEMO_PASSWORD, DEMO_USERS, DEMO_WORKSPACE } from './demo/accounts.ts';

const url = process.env.DATABASE_URL;
if (!url) {
	console.error('[pincer] DATABASE_URL is not set');
	process.exit(1);
}
const client = postgres(url, { max: 1, onnotice: () => {} });
const db = drizzle(client, { schema, casing: 'snake_case' });

try {
	await db.transaction(async (tx) => {
		const [existing] = await tx
			.select({ id: schema.workspaces.id })
			.from(schema.workspaces)
			.where(eq(schema.workspaces.slug, DEMO_WORKSPACE.slug));
		if (existing) {
			console.error('[pincer] demo workspace already present; left as it is');
			return;
		}
		const [workspace] = await tx
			.insert(schema.workspaces)
			.values({ name: DEMO_WORKSPACE.name, slug: DEMO_WORKSPACE.slug, seats: 10 })
			.returning();
		const passwordHash = await hash(DEMO_PASSWORD);
		for (const demo of DEMO_USERS) {
			const [user] = await tx
				.insert(schema.users)
				.values({ email: demo.email, name: demo.name, passwordHash, emailVerified: new Date() })
				.onConflictDoNothing({ target: schema.users.email })
				.returning();
			if (!user) continue;
			await tx
				.insert(schema.memberships)
				.values({ workspaceId: workspace.id, userId: user.id, role: demo.role });
		}
		await appendAuditEvent(tx, {
			workspaceId: workspace.id,
			actorId: null,
			action: 'workspace.seed',
			subject: `workspace:${workspace.id}`,
			payload: { note: 'demo workspace created by the seed script' }
		});
		console.error(`[pincer] demo workspace "${DEMO_WORKSPACE.name}" seeded`);
	});
} catch (err) {
	console.error(`[pincer] seeding failed: ${(err as Error).message}`);
	process.exitCode = 1;
} finally {
	await client.end();
}
