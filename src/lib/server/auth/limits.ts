import { normalizeEmail } from '../../forms/account';
import { getConfig } from '../config';
import { createRateLimiter, type RateLimiter, type RateLimiterOptions } from './rate-limit';

/**
 * The rate limits of the account routes, shared by the forms and the JSON API so that one
 * cannot be used to get around the other, and kept in the database so that they hold across
 * processes. Keys are the client address and the e-mail address:
 *
 * | action          | per client address   | per (e-mail, address) | per e-mail, any address        |
 * |-----------------|----------------------|-----------------------|--------------------------------|
 * | sign-in         | 20 failures / 15 min | 5 failures / 15 min   | past 10 failures / 15 min, every try waits 3 s |
 * | sign-up         | 30 attempts / hour   | –                     | 5 attempts / hour              |
 * | password reset  | 10 requests / hour   | –                     | 3 requests / hour              |
 * | new verify link | –                    | –                     | 3 per account / hour           |
 *
 * Sign-in counts failures only (a wrong password for a well-formed address), never a success.
 * The hard limits are per client address and per (e-mail, address): wrong guesses from one place
 * lock out that place, not the owner of the account signing in from somewhere else. Many failures
 * for one e-mail from many places only slow every try for it down, the owner's included.
 *
 * `AUTH_LIMIT_SCALE` (default 1) multiplies every maximum, for load tests or a school behind one
 * NAT address.
 */
const MINUTE = 60_000;
export const AUTH_LIMITS = {
	signInAddress: { max: 20, windowMs: 15 * MINUTE },
	signInPair: { max: 5, windowMs: 15 * MINUTE },
	signInEmail: { max: 10, windowMs: 15 * MINUTE },
	signUpAddress: { max: 30, windowMs: 60 * MINUTE },
	signUpEmail: { max: 5, windowMs: 60 * MINUTE },
	resetAddress: { max: 10, windowMs: 60 * MINUTE },
	resetEmail: { max: 3, windowMs: 60 * MINUTE },
	resendAccount: { max: 3, windowMs: 60 * MINUTE }
} as const satisfies Record<string, RateLimiterOptions>;

/** How long a sign-in try waits once its e-mail has had `signInEmail.max` failures. */
export const SIGN_IN_SLOW_DOWN_MS = 3000;

export type AuthLimitName = keyof typeof AUTH_LIMITS;

/** Each limit's name in the counter table. */
const BUCKETS: Record<AuthLimitName, string> = {
	signInAddress: 'sign-in-address',
	signInPair: 'sign-in-pair',
	signInEmail: 'sign-in-email',
	signUpAddress: 'sign-up-address',
	signUpEmail: 'sign-up-email',
	resetAddress: 'reset-address',
	resetEmail: 'reset-email',
	resendAccount: 'resend-account'
};

const wait = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

interface Setup {
	limiters: Record<AuthLimitName, RateLimiter>;
	slowDownMs: number;
	pause: (ms: number) => Promise<void>;
}
let setup: Setup | null = null;

function build(
	overrides: Partial<Record<AuthLimitName, RateLimiterOptions>>,
	options: { slowDownMs?: number; pause?: (ms: number) => Promise<void> }
): Setup {
	const factor = getConfig().authLimitScale;
	const limiters = {} as Record<AuthLimitName, RateLimiter>;
	for (const name of Object.keys(AUTH_LIMITS) as AuthLimitName[]) {
		const base = overrides[name] ?? {
			max: Math.max(1, Math.round(AUTH_LIMITS[name].max * factor)),
			windowMs: AUTH_LIMITS[name].windowMs
		};
		limiters[name] = createRateLimiter(BUCKETS[name], base);
	}
	return {
		limiters,
		slowDownMs: options.slowDownMs ?? SIGN_IN_SLOW_DOWN_MS,
		pause: options.pause ?? wait
	};
}

/**
 * Replace the limits (tests use small windows and maxima, and watch the slow-down through
 * `pause`); with no argument, go back to the defaults. Either way every count starts from zero.
 */
export async function configureAuthLimits(
	overrides: Partial<Record<AuthLimitName, RateLimiterOptions>> = {},
	options: { slowDownMs?: number; pause?: (ms: number) => Promise<void> } = {}
): Promise<void> {
	setup = build(overrides, options);
	for (const limiter of Object.values(setup.limiters)) await limiter.reset();
}

function get(): Setup {
	setup ??= build({}, {});
	return setup;
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

/**
 * At most `capacity` holders per key at once in this process; the others wait their turn.
 * Password checks go through these gates so that a burst of parallel guesses cannot all be
 * checked before the first failure is counted, without counting anything in advance (which
 * refused correct passwords that happened to arrive together). The counts themselves are in the
 * database; with several processes a burst can outrun them by at most one check per process
 * and (e-mail, address), which the gates here bound and nothing else needs to.
 */
class Gates {
	private readonly held = new Map<string, { active: number; queue: (() => void)[] }>();
	constructor(private readonly capacity: number) {}

	async enter(key: string): Promise<() => void> {
		let gate = this.held.get(key);
		if (!gate) {
			gate = { active: 0, queue: [] };
			this.held.set(key, gate);
		}
		const g = gate;
		if (g.active >= this.capacity) await new Promise<void>((resolve) => g.queue.push(resolve));
		else g.active += 1;
		return () => {
			const next = g.queue.shift();
			// The slot passes straight to the next in line, so `active` stays the same.
			if (next) return next();
			g.active -= 1;
			if (g.active === 0) this.held.delete(key);
		};
	}
}

/** One password check per (e-mail, address) at a time; four per address (argon2's threads). */
const pairGates = new Gates(1);
const addressGates = new Gates(4);

/** What a sign-in service answers, as far as the limits care. */
export interface SignInOutcome {
	ok: boolean;
	reason?: string;
}

export type LimitedSignIn<R> =
	{ limited: true; retryAfterSeconds: number } | { limited: false; result: R };

/**
 * Run one sign-in try (`check`, which checks the password) under the limits: refused at once
 * when the client address or this (e-mail, address) pair has too many failures; slowed down
 * when the e-mail has many failures from anywhere; counted as a failure only when `check`
 * answers `wrong-credentials`. A success clears this pair's failures; a refusal for a missing
 * field counts nothing.
 *
 * @example
 * const tried = await limitSignIn(getClientAddress(), email, () => signIn({ email, password }));
 * if (tried.limited) return tooManyRequests(tried.retryAfterSeconds);
 */
export async function limitSignIn<R extends SignInOutcome>(
	address: string,
	email: unknown,
	check: () => Promise<R>,
	now: () => number = Date.now
): Promise<LimitedSignIn<R>> {
	const { limiters: l, slowDownMs, pause } = get();
	const key = emailKey(email);
	const pair = `${key}\n${address}`;
	const hardLimit = async () =>
		worst(await l.signInAddress.peek(address, now()), await l.signInPair.peek(pair, now()));

	// Refused before waiting in line, so a flood from one place queues nothing.
	let verdict = await hardLimit();
	if (!verdict.allowed) return { limited: true, retryAfterSeconds: verdict.retryAfterSeconds };
	if (!(await l.signInEmail.peek(key, now())).allowed) await pause(slowDownMs);

	const leavePair = await pairGates.enter(pair);
	let leaveAddress: (() => void) | null = null;
	try {
		leaveAddress = await addressGates.enter(address);
		// Tries ahead in line may have used up the limit meanwhile.
		verdict = await hardLimit();
		if (!verdict.allowed) return { limited: true, retryAfterSeconds: verdict.retryAfterSeconds };
		const result = await check();
		if (result.ok) {
			await l.signInPair.reset(pair);
		} else if (result.reason === 'wrong-credentials') {
			const at = now();
			await l.signInAddress.consume(address, at);
			await l.signInPair.consume(pair, at);
			await l.signInEmail.consume(key, at);
		}
		return { limited: false, result };
	} finally {
		leaveAddress?.();
		leavePair();
	}
}

/**
 * Count one try against a per-address and a per-e-mail limit. An address that is not a
 * well-formed e-mail (missing, empty, garbled) is counted per client address only: all such
 * tries would otherwise share one bucket that a stranger could fill for everyone.
 */
async function consumeBoth(
	byAddress: RateLimiter,
	byEmail: RateLimiter,
	address: string,
	email: unknown,
	now: number
): Promise<LimitVerdict> {
	const normalized = normalizeEmail(email);
	return worst(
		await byAddress.consume(address, now),
		normalized ? await byEmail.consume(normalized, now) : { allowed: true, retryAfterSeconds: 0 }
	);
}

/** Count a sign-up attempt; refused when either key is over its limit. */
export function consumeSignUp(
	address: string,
	email: unknown,
	now = Date.now()
): Promise<LimitVerdict> {
	const l = get().limiters;
	return consumeBoth(l.signUpAddress, l.signUpEmail, address, email, now);
}

/** Count a reset request; refused when either key is over its limit. */
export function consumeReset(
	address: string,
	email: unknown,
	now = Date.now()
): Promise<LimitVerdict> {
	const l = get().limiters;
	return consumeBoth(l.resetAddress, l.resetEmail, address, email, now);
}

/** Count a request for a fresh verification link by a signed-in account. */
export async function consumeResend(userId: string, now = Date.now()): Promise<LimitVerdict> {
	return worst(await get().limiters.resendAccount.consume(userId, now));
}
