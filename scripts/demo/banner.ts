// Prints the demo sign-ins and local fake addresses for the npm start banner.
import { DEMO_PASSWORD, DEMO_USERS, DEMO_WORKSPACE } from './accounts.ts';

const lines = [`  Demo workspace        ${DEMO_WORKSPACE.name}`];
for (const user of DEMO_USERS) lines.push(`    ${user.role.padEnd(9)} ${user.email}`);
lines.push(`    password  ${DEMO_PASSWORD}`);
if (process.env.PINCER_INBOX_URL)
	lines.push(`  Local inbox           ${process.env.PINCER_INBOX_URL}`);
console.log(lines.join('\n'));
