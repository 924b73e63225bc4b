import { getConfig } from '../config';
import { createRateLimiter, type RateLimiter, type RateLimiterOptions } from './rate-limit';

/**
 * The rate limits of the account routes, shared by the forms and the JSON API so that one
 * cannot be used to get around the other. Keys are the client address and the e-mail address:
 *
 * | action          | per client address        | per e-mail address       |
 * |-----------------|---------------------------|--------------------------|
 * | sign-in         | 20 failures / 15 min      | 5 failures / 15 min      |
 * | sign-up         | 30 attempts / hour        | 5 attempts / hour        |
 * | password reset  | 10 requests / hour        | 3 requests / hour        |
 * | new verify link | –                         | 3 per account / hour     |
 *
 * Sign-in counts failures only, and a success clears that e-mail's count. A try counts as a
 * failure from the moment it starts (`beginSignIn`) until it is known to be none: checking a
 * password takes an argon2 hash, and a burst of parallel tries must not all pass the check before
 * the first failure is counted. `AUTH_LIMIT_SCALE`
 * (default 1) multiplies every maximum, for load tests or a school behind one NAT address.
 */
const MINUTE = 60_000;
export const AUTH_LIMITS = {
	signInAddress: { max: 20, windowMs: 15 * MINUTE },
	signInEmail: { max: 5, windowMs: 15 * MINUTE },
	signUpAddress: { max: 30, windowMs: 60 * MINUTE },
	signUpEmail: { max: 5, windowMs: 60 * MINUTE },
	resetAddress: { max: 10, windowMs: 60 * MINUTE },
	resetEmail: { max: 3, windowMs: 60 * MINUTE },
	resendAccount: { max: 3, windowMs: 60 * MINUTE }
} as const satisfies Record<string, RateLimiterOptions>;

export type AuthLimitName = keyof typeof AUTH_LIMITS;

function scale(): number {
	return getConfig().authLimitScale;
}

let limiters: Record<AuthLimitName, RateLimiter> | null = null;

/**
 * Replace the limits (tests use small windows and maxima); with no argument, go back to the
 * defaults. Either way every count starts from zero.
 */
export function configureAuthLimits(
	overrides: Partial<Record<AuthLimitName, RateLimiterOptions>> = {}
) {
	const factor = scale();
	const built = {} as Record<AuthLimitName, RateLimiter>;
	for (const name of Object.keys(AUTH_LIMITS) as AuthLimitName[]) {
		const base = overrides[name] ?? {
			max: Math.max(1, Math.round(AUTH_LIMITS[name].max * factor)),
			windowMs: AUTH_LIMITS[name].windowMs
		};
		built[name] = createRateLimiter(base);
	}
	limiters = built;
}

function get(): Record<AuthLimitName, RateLimiter> {
	if (!limiters) configureAuthLimits();
	return limiters!;
}

export type LimitVerdict = { allowed: true } | { allowed: false; retryAfterSeconds: number };

function worst(...results: { allowed: boolean; retryAfterSeconds: number }[]): LimitVerdict {
	const refused = results.filter((r) => !r.allowed);
	if (refused.length === 0) return { allowed: true };
	return {
		allowed: false,
		retryAfterSeconds: Math.max(...refused.map((r) => r.retryAfterSeconds))
	};
}

/** A loose e-mail key: the same address in any case or spacing counts once. */
function emailKey(email: unknown): string {
	return typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : '';
}

/** A sign-in try under way, counted as a failure until it is known to be none. */
export interface SignInAttempt {
	address: string;
	email: unknown;
	/** When its provisional failure was counted. */
	at: number;
}

/**
 * May this client try to sign in to this address now? If so the try is counted as a failure
 * straight away; a refused try counts nothing. Follow it with `recordSignInSuccess` or
 * `cancelSignIn` unless the password was wrong.
 */
export function beginSignIn(
	address: string,
	email: unknown,
	now = Date.now()
): ({ allowed: true } & SignInAttempt) | { allowed: false; retryAfterSeconds: number } {
	const l = get();
	const verdict = worst(
		l.signInAddress.peek(address, now),
		l.signInEmail.peek(emailKey(email), now)
	);
	if (!verdict.allowed) return verdict;
	l.signInAddress.consume(address, now);
	l.signInEmail.consume(emailKey(email), now);
	return { allowed: true, address, email, at: now };
}

/** The try never got as far as a password (a field was missing): it counts as nothing. */
export function cancelSignIn({ address, email, at }: SignInAttempt): void {
	const l = get();
	l.signInAddress.release(address, at);
	l.signInEmail.release(emailKey(email), at);
}

/** A successful sign-in clears the failures of that e-mail (not those of the client address). */
export function recordSignInSuccess({ address, email, at }: SignInAttempt): void {
	const l = get();
	l.signInAddress.release(address, at);
	l.signInEmail.reset(emailKey(email));
}

/** Count a sign-up attempt; refused when either key is over its limit. */
export function consumeSignUp(address: string, email: unknown, now = Date.now()): LimitVerdict {
	const l = get();
	return worst(l.signUpAddress.consume(address, now), l.signUpEmail.consume(emailKey(email), now));
}

/** Count a reset request; refused when either key is over its limit. */
export function consumeReset(address: string, email: unknown, now = Date.now()): LimitVerdict {
	const l = get();
	return worst(l.resetAddress.consume(address, now), l.resetEmail.consume(emailKey(email), now));
}

/** Count a request for a fresh verification link by a signed-in account. */
export function consumeResend(userId: string, now = Date.now()): LimitVerdict {
	return worst(get().resendAccount.consume(userId, now));
}
