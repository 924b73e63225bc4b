import { describe, expect, test } from 'vitest';
import {
	checkPasswordStrength,
	hashPassword,
	verifyPassword
} from '../../../src/lib/server/auth/password';

describe('password strength', () => {
	test.each([
		['walking-bass-7', true],
		['TwelveKeys', true],
		['1234567890x', true],
		['short-1', false], // under 10 characters
		['abcdefghijkl', false], // one kind only
		['12345678901234', false], // one kind only
		['aaaaaaaaaa11', false], // fewer than four different characters
		['', false],
		['ab1-'.repeat(50), true], // exactly 200
		['ab1-'.repeat(50) + 'c', false] // over 200
	])('%j is accepted: %s', (password, ok) => {
		expect(checkPasswordStrength(password).ok).toBe(ok);
	});

	test('a refusal says what to change', () => {
		expect(checkPasswordStrength('short')).toEqual({
			ok: false,
			message: 'Use at least 10 characters.'
		});
	});
});

describe('password hashing', () => {
	test('stores an argon2id hash that verifies the password and nothing else', async () => {
		const hash = await hashPassword('walking-bass-7');
		// PHC string format of argon2id (RFC 9106 names the variant; the PHC format prefixes it).
		expect(hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
		expect(await verifyPassword(hash, 'walking-bass-7')).toBe(true);
		expect(await verifyPassword(hash, 'walking-bass-8')).toBe(false);
	});

	test('a malformed stored hash answers false instead of throwing', async () => {
		expect(await verifyPassword('not-a-hash', 'anything')).toBe(false);
	});
});
