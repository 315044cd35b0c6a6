// The authorisation boundary. Every load, form action and +server.ts handler calls one of these
// (tests/integration/guard-coverage.test.ts fails when one does not).
import { error, redirect, type RequestEvent } from '@sveltejs/kit';
import { asc, eq } from 'drizzle-orm';
import { db } from '../db';
import { memberships, users, workspaces, type Role } from '../db/schema';
import { readOnlyMessage, readOnlyReason } from '../billing/status';

export const WORKSPACE_COOKIE = 'pincer_workspace';

export type SignedInUser = { id: string; email: string; name: string | null };
export type WorkspaceMembership = {
	membershipId: string;
	id: string;
	name: string;
	slug: string;
	seats: number;
	/** Stripe's subscription status, or `trialing` for our own trial (see billing/status.ts). */
	subscriptionStatus: string;
	trialEndsAt: Date | null;
	role: Role;
};
export type Actor = {
	user: SignedInUser;
	/** Every workspace the user belongs to, with their role in each. */
	workspaces: WorkspaceMembership[];
	/** The workspace this request acts in (chosen with the switcher), or null if none. */
	workspace: WorkspaceMembership | null;
};

async function loadActor(event: RequestEvent): Promise<Actor | null> {
	const session = await event.locals.auth();
	const userId = session?.user?.id;
	if (!userId) return null;
	const [user] = await db
		.select({ id: users.id, email: users.email, name: users.name })
		.from(users)
		.where(eq(users.id, userId));
	if (!user) return null;
	const rows = await db
		.select({
			membershipId: memberships.id,
			id: workspaces.id,
			name: workspaces.name,
			slug: workspaces.slug,
			seats: workspaces.seats,
			subscriptionStatus: workspaces.subscriptionStatus,
			trialEndsAt: workspaces.trialEndsAt,
			role: memberships.role
		})
		.from(memberships)
		.innerJoin(workspaces, eq(workspaces.id, memberships.workspaceId))
		.where(eq(memberships.userId, userId))
		.orderBy(asc(memberships.createdAt));
	const chosen = event.cookies.get(WORKSPACE_COOKIE);
	const workspace = rows.find((w) => w.id === chosen) ?? rows[0] ?? null;
	return { user, workspaces: rows, workspace };
}

/** The signed-in actor or null; memoised per request. */
export function getActor(event: RequestEvent): Promise<Actor | null> {
	event.locals.actor ??= loadActor(event);
	return event.locals.actor;
}

function isApi(event: RequestEvent) {
	return event.route.id?.startsWith('/api/') ?? false;
}

/** A signed-in user, else the sign-in page (or 401 for the API). */
export async function requireUser(event: RequestEvent): Promise<Actor> {
	const actor = await getActor(event);
	if (!actor) {
		if (isApi(event)) error(401, 'Sign in or send an API key.');
		const next = event.url.pathname + event.url.search;
		redirect(303, `/signin?next=${encodeURIComponent(next)}`);
	}
	return actor;
}

export type WorkspaceActor = Actor & { workspace: WorkspaceMembership; role: Role };

const READS = new Set(['GET', 'HEAD', 'OPTIONS']);
/** Non-GET requests an unpaid, read-only workspace still allows: paying, checking the audit chain, previews. */
const UNPAID_MAY = [
	'/(app)/app/settings/billing',
	'/(app)/app/audit?/check',
	// A live preview computes and stores nothing.
	'/(app)/app/deals/[dealId=uuid]/analyse'
];

/** Refuses a write (any non-GET) in a workspace whose subscription ended, with the reason. */
export function assertWritable(event: RequestEvent, workspace: WorkspaceMembership): void {
	if (READS.has(event.request.method)) return;
	const reason = readOnlyReason(workspace);
	if (!reason) return;
	const at = `${event.route.id}${event.url.search.startsWith('?/') ? event.url.search : ''}`;
	if (UNPAID_MAY.some((allowed) => at.startsWith(allowed))) return;
	error(403, readOnlyMessage(workspace, reason));
}

/** A member of the active workspace whose role is one of `roles` (any role when none given). */
export async function requireRole(event: RequestEvent, ...roles: Role[]): Promise<WorkspaceActor> {
	const actor = await requireUser(event);
	if (!actor.workspace) error(403, 'You are not a member of any workspace yet.');
	const role = actor.workspace.role;
	if (roles.length && !roles.includes(role)) {
		error(403, `Your role in ${actor.workspace.name} (${role}) cannot do this.`);
	}
	assertWritable(event, actor.workspace);
	return { ...actor, workspace: actor.workspace, role };
}

/** Roles that may change data of each kind; reviewers read only. */
export const writers = {
	loans: ['admin', 'officer'] as Role[],
	deals: ['admin', 'analyst'] as Role[],
	team: ['admin'] as Role[],
	audit: ['admin', 'reviewer'] as Role[]
};
