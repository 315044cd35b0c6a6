// Rows for integration tests, written straight through Drizzle (invented names only).
import { randomUUID } from 'node:crypto';
import { db } from '$lib/server/db';
import { memberships, users, workspaces, type Role } from '$lib/server/db/schema';

export async function makeWorkspace(seats = 3, name = 'Test Workspace') {
	const [workspace] = await db
		.insert(workspaces)
		.values({ name, slug: `test-${randomUUID()}`, seats })
		.returning();
	return workspace;
}

export async function makeUser(label = 'user') {
	const [user] = await db
		.insert(users)
		.values({ email: `${label}-${randomUUID().slice(0, 8)}@example.test`, name: label })
		.returning();
	return user;
}

export async function makeMember(workspaceId: string, role: Role, label: string = role) {
	const user = await makeUser(label);
	const [membership] = await db
		.insert(memberships)
		.values({ workspaceId, userId: user.id, role })
		.returning();
	return { user, membership };
}
