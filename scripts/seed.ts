// Seeds the invented demo workspace once. Idempotent: each part checks whether it already
// exists and leaves existing rows (and anything users changed) alone.
import { hash } from '@node-rs/argon2';
import { count, eq } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import { appendAuditEvent } from '../src/lib/server/audit/chain.ts';
import * as schema from '../src/lib/server/db/schema/index.ts';
import type { Role } from '../src/lib/server/db/schema/workspaces.ts';
import { DEMO_PASSWORD, DEMO_USERS, DEMO_WORKSPACE } from './demo/accounts.ts';
import { DEMO_DEALS } from './demo/deals.ts';
import { DEMO_LOANS } from './demo/loans.ts';

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
			.values({
				name: DEMO_WORKSPACE.name,
				slug: DEMO_WORKSPACE.slug,
				seats: 10,
				subscriptionStatus: 'active'
			})
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
	await seedLoans();
	await seedDeals();
} catch (err) {
	console.error(`[pincer] seeding failed: ${(err as Error).message}`);
	process.exitCode = 1;
} finally {
	await client.end();
	const { sqlClient } = await import('$lib/server/db');
	await sqlClient.end();
}

/**
 * Who seeds a part of the demo: the demo workspace and the demo user of `role`, or null when the
 * workspace is missing or already holds rows of `table` (each part is seeded once, never twice).
 */
async function actingFor(role: Role, table: typeof schema.loans | typeof schema.deals) {
	const [workspace] = await db
		.select({ id: schema.workspaces.id })
		.from(schema.workspaces)
		.where(eq(schema.workspaces.slug, DEMO_WORKSPACE.slug));
	if (!workspace) return null;
	const [{ n }] = await db
		.select({ n: count() })
		.from(table)
		.where(eq(table.workspaceId, workspace.id));
	if (n > 0) return null;
	const [user] = await db
		.select({ id: schema.users.id })
		.from(schema.users)
		.where(eq(schema.users.email, DEMO_USERS.find((u) => u.role === role)!.email));
	return user ? { workspaceId: workspace.id, actorId: user.id } : null;
}

/** The demo loan files, through the same service the screens use (solved and audited). */
async function seedLoans() {
	const acting = await actingFor('officer', schema.loans);
	if (!acting) return;
	const { createLoan, markDisclosed } = await import('$lib/server/loans');
	const { runToleranceCheck } = await import('$lib/server/loans/checks');
	for (const demo of DEMO_LOANS) {
		const saved = await createLoan(acting, demo.file);
		if (!saved.ok) throw new Error(`demo loan: ${saved.message}`);
		if (demo.disclose) await markDisclosed(acting, saved.loanId);
		if (demo.check) await runToleranceCheck(acting, saved.loanId, { disclosedApr: demo.check.apr });
	}
	console.error(`[pincer] ${DEMO_LOANS.length} demo loan files seeded`);
}

/** The demo deals (one with two rates, one with a scenario), through the deals service. */
async function seedDeals() {
	const acting = await actingFor('analyst', schema.deals);
	if (!acting) return;
	const { createDeal, createScenario, updateDeal } = await import('$lib/server/deals');
	const { dealContentSchema } = await import('$lib/schemas/deal');
	for (const demo of DEMO_DEALS) {
		const content = dealContentSchema.parse(demo.content);
		const created = await createDeal(acting, demo.name, content);
		if (demo.scenario && created) {
			const copy = await createScenario(acting, created.dealId);
			if (copy) {
				const changed = dealContentSchema.parse(demo.scenario(demo.content));
				await updateDeal(acting, copy.dealId, `${demo.name} — scenario 1`, changed);
			}
		}
	}
	console.error(`[pincer] ${DEMO_DEALS.length} demo deals seeded`);
}
