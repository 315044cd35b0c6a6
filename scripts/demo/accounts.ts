// The invented demo workspace and its four users, one per role. Demo only.
import type { Role } from '../../src/lib/server/db/schema/workspaces.ts';

export const DEMO_WORKSPACE = { name: 'Bramblecove Credit Cooperative', slug: 'bramblecove' };
export const DEMO_PASSWORD = 'pincer-demo-2026';
export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
	{ email: 'admin@bramblecove.example', name: 'Wren Halloway', role: 'admin' },
	{ email: 'officer@bramblecove.example', name: 'Tobias Fenwright', role: 'officer' },
	{ email: 'analyst@bramblecove.example', name: 'Ada Quillfeather', role: 'analyst' },
	{ email: 'reviewer@bramblecove.example', name: 'Marguerite Oakes', role: 'reviewer' }
];
