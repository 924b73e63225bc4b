import { afterAll, beforeAll, beforeEach, describe, expect, test, vi } from 'vitest';
import { createToken } from '../../../src/lib/server/auth/tokens';
import { openTestWorld, type TestWorld } from '../support/world';

// Count the argon2 hashes without changing them: the real function runs behind the spy.
vi.mock('../../../src/lib/server/auth/password', async (importOriginal) => {
	const real = await importOriginal<typeof import('../../../src/lib/server/auth/password')>();
	return { ...real, hashPassword: vi.fn(real.hashPassword) };
});

const { hashPassword } = await import('../../../src/lib/server/auth/password');
const { requestPasswordReset, resetPassword, signUp } =
	await import('../../../src/lib/server/auth/accounts');
const { tokenFromOutbox } = await import('../support/world');

let world: TestWorld;
beforeAll(async () => {
	world = await openTestWorld();
});
afterAll(() => world.close());
beforeEach(() => {
	vi.mocked(hashPassword).mockClear();
});

describe('what a reset attempt costs', () => {
	test.each([
		['a made-up token of the right shape', () => createToken(), 'This link is not valid.'],
		['a token far too short', () => 'abc', 'This link is incomplete or malformed.']
	])('%s is turned away before any password is hashed', async (_name, token, message) => {
		expect(await resetPassword(token(), 'comping-chords-9')).toEqual({
			ok: false,
			reason: 'bad-token',
			message
		});
		expect(hashPassword).not.toHaveBeenCalled();
	});

	test('a real link still hashes the new password once, and only once', async () => {
		const email = 'cost@example.test';
		await signUp({ email, password: 'walking-bass-7', name: 'Cost', role: 'learner' });
		await requestPasswordReset(email);
		const token = await tokenFromOutbox(email, '/reset-password');
		vi.mocked(hashPassword).mockClear();
		expect(await resetPassword(token, 'comping-chords-9')).toMatchObject({ ok: true });
		expect(hashPassword).toHaveBeenCalledTimes(1);
		expect(await resetPassword(token, 'another-one-10')).toMatchObject({ reason: 'bad-token' });
		expect(hashPassword).toHaveBeenCalledTimes(1);
	});
});
