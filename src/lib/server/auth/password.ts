import { hash, verify } from '@node-rs/argon2';

/**
 * argon2id with the OWASP-recommended minimum (19 MiB, 2 passes, 1 lane). `@node-rs/argon2`
 * defaults to argon2id; the parameters are written out so the stored hashes stay readable.
 */
const ARGON2_OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 };

export const MIN_PASSWORD_LENGTH = 10;
export const MAX_PASSWORD_LENGTH = 200;

export type PasswordCheck = { ok: true } | { ok: false; message: string };

/**
 * A plain rule a person can follow: 10 to 200 characters, not made of only one kind of character
 * (only letters, only digits…), and not the same character over and over.
 *
 * @example checkPasswordStrength('slide-up-a-fourth') // → { ok: true }
 */
export function checkPasswordStrength(password: string): PasswordCheck {
	if (password.length < MIN_PASSWORD_LENGTH) {
		return { ok: false, message: `Use at least ${MIN_PASSWORD_LENGTH} characters.` };
	}
	if (password.length > MAX_PASSWORD_LENGTH) {
		return { ok: false, message: `Use at most ${MAX_PASSWORD_LENGTH} characters.` };
	}
	const classes = [/[a-z]/, /[A-Z]/, /[0-9]/, /[^a-zA-Z0-9]/].filter((re) => re.test(password));
	if (classes.length < 2) {
		return {
			ok: false,
			message: 'Mix at least two kinds of characters: lower case, upper case, digits or symbols.'
		};
	}
	if (new Set(password).size < 4) {
		return { ok: false, message: 'Use more than three different characters.' };
	}
	return { ok: true };
}

export function hashPassword(password: string): Promise<string> {
	return hash(password, ARGON2_OPTIONS);
}

/** False for a wrong password and for a malformed stored hash alike. */
export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		return false;
	}
}
