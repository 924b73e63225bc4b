import { createHash, randomBytes } from 'node:crypto';

/**
 * A fresh secret for a link or a session: 32 random bytes, base64url (43 characters).
 *
 * @example createToken() // → 'q3Jw…' (43 characters)
 */
export function createToken(): string {
	return randomBytes(32).toString('base64url');
}

/**
 * What the database stores in place of a secret: its SHA-256 in hex. A leaked table then holds
 * nothing that opens a session or a link.
 *
 * @example hashToken('abc') // → 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'
 */
export function hashToken(token: string): string {
	return createHash('sha256').update(token, 'utf8').digest('hex');
}
