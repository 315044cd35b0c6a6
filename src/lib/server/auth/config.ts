import { DrizzleAdapter } from '@auth/drizzle-adapter';
import { SvelteKitAuth, type SvelteKitAuthConfig } from '@auth/sveltekit';
import Credentials from '@auth/sveltekit/providers/credentials';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import { env } from '$env/dynamic/private';
import { eq } from 'drizzle-orm';
import { signInSchema } from '$lib/schemas/account';
import { db } from '../db';
import { accounts, users, verificationTokens } from '../db/schema';
import { sendMail } from '../mail';
import { signInLinkMail } from '../mail/templates';
import { auditForUser } from './audit-user';
import { verifyPassword } from './password';

export const LINK_MINUTES = 15;
export const SESSION_HOURS = 12;

async function findUser(email: string) {
	const [user] = await db.select().from(users).where(eq(users.email, email.toLowerCase()));
	return user;
}

/** Auth.js configuration. Only this folder knows it exists; the app calls our guards. */
export function authConfig(): SvelteKitAuthConfig {
	return {
		secret: env.AUTH_SECRET,
		trustHost: true,
		logger: {
			// A wrong password is an expected outcome, answered on the form; not an error to log.
			error(err) {
				if (err.name !== 'CredentialsSignin') console.error('[auth]', err);
			}
		},
		adapter: DrizzleAdapter(db, {
			usersTable: users,
			accountsTable: accounts,
			verificationTokensTable: verificationTokens
		}),
		session: { strategy: 'jwt', maxAge: SESSION_HOURS * 3600 },
		pages: { signIn: '/signin', verifyRequest: '/signin/check-email', error: '/signin/problem' },
		providers: [
			Credentials({
				credentials: { email: {}, password: {} },
				async authorize(input) {
					const parsed = signInSchema.safeParse(input);
					if (!parsed.success) return null;
					const user = await findUser(parsed.data.email);
					if (!user || !(await verifyPassword(user.passwordHash, parsed.data.password)))
						return null;
					return { id: user.id, email: user.email, name: user.name };
				}
			}),
			Nodemailer({
				server: env.SMTP_URL || 'smtp://127.0.0.1:2525',
				from: env.MAIL_FROM || 'Pincer <no-reply@pincer.localhost>',
				maxAge: LINK_MINUTES * 60,
				async sendVerificationRequest({ identifier, url }) {
					await sendMail(signInLinkMail(identifier, url, LINK_MINUTES));
				}
			})
		],
		callbacks: {
			// A link signs in only an existing account: sign-up is where accounts are made.
			async signIn({ user, account }) {
				if (account?.provider !== 'nodemailer') return true;
				return !!(user.email && (await findUser(user.email)));
			},
			jwt({ token, user }) {
				if (user?.id) token.sub = user.id;
				return token;
			},
			session({ session, token }) {
				if (token.sub) session.user.id = token.sub;
				return session;
			}
		},
		events: {
			async signIn({ user, account }) {
				if (!user.id) return;
				const userId = user.id;
				const method = account?.provider === 'nodemailer' ? 'e-mailed link' : 'password';
				await db.transaction((tx) => auditForUser(tx, userId, 'auth.signin', { method }));
			}
		}
	};
}

// Built on the first request (when $env/dynamic is readable), then reused: building it per
// request re-created the Drizzle adapter's table definitions each time, a measurable share of
// every API call's CPU.
let config: SvelteKitAuthConfig | undefined;
export const { handle: authHandle } = SvelteKitAuth(async () => (config ??= authConfig()));
