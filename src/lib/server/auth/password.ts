import { hash, verify } from '@node-rs/argon2';

// argon2id with the library's defaults (m = 19 MiB, t = 2, p = 1), as OWASP recommends (common practice).
export function hashPassword(password: string): Promise<string> {
	return hash(password);
}

// A fixed hash so that an unknown e-mail costs the same time as a wrong password.
const DECOY =
	'$argon2id$v=19$m=19456,t=2,p=1$VPSnmyqRgTgjJAWjcb676g$32jyR7Zx0Hkx54j9ASvU8THuTK6DcJ4TkhcidcGSr38';

export async function verifyPassword(
	passwordHash: string | null | undefined,
	password: string
): Promise<boolean> {
	try {
		const ok = await verify(passwordHash ?? DECOY, password);
		return ok && !!passwordHash;
	} catch {
		return false;
	}
}
