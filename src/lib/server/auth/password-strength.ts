import type { Match, ZxcvbnFactory, ZxcvbnResult } from '@zxcvbn-ts/core';
import { checkPasswordLength, passwordRefusal, type PasswordCheck } from '../../forms/account';

/**
 * Whether a new password is hard to guess: the length rule first (pure, shared with the form),
 * then a strength estimate over common-password lists, English words and names, keyboard
 * patterns, runs, repeats and dates (`@zxcvbn-ts/core` with its common and English
 * dictionaries), with the owner's own name and address added as the first words an attacker
 * tries. A refusal says which of these it found, then the rule.
 */

/** Words anyone attacking this site tries first, whoever the account belongs to. */
const SITE_WORDS = ['twelvefold'];

/**
 * The least score (0–4) accepted. 3 stands for about 10⁸ guesses in the estimator's model: out
 * of reach of an online attack that our rate limits slow down, and of a quick offline one
 * against a 19 MiB argon2id hash.
 */
const MIN_SCORE = 3;

/**
 * Only the first characters are examined. The estimator's work grows steeply with length (a
 * 200-character password of l33t-looking symbols took seconds); a password whose first 64
 * characters are hard to guess is hard to guess.
 */
const EXAMINED_LENGTH = 64;

/**
 * How many look-alike substitutions (`@` for `a`, `0` for `o`) are tried at once. The default
 * (100) lets one crafted password hold the event loop for seconds; four catch `p@ssw0rd` and
 * friends at a few milliseconds.
 */
const L33T_SUBSTITUTIONS = 4;

let estimator: Promise<ZxcvbnFactory> | null = null;

/**
 * The estimator with its dictionaries, built on the first call: the word lists are several MB
 * and take most of a second to index, which a server that never sees a new password should not
 * pay at start. A failed load is forgotten, so the next call tries again.
 */
function loadEstimator(): Promise<ZxcvbnFactory> {
	estimator ??= (async () => {
		const [{ ZxcvbnFactory }, common, english] = await Promise.all([
			import('@zxcvbn-ts/core'),
			import('@zxcvbn-ts/language-common'),
			import('@zxcvbn-ts/language-en')
		]);
		return new ZxcvbnFactory({
			dictionary: { ...common.dictionary, ...english.dictionary },
			graphs: common.adjacencyGraphs,
			translations: english.translations,
			maxLength: EXAMINED_LENGTH,
			l33tMaxSubstitutions: L33T_SUBSTITUTIONS
		});
	})().catch((error: unknown) => {
		estimator = null;
		throw error;
	});
	return estimator;
}

/** The person whose password it is: what an attacker who knows them tries first. */
export interface PasswordOwner {
	name?: string | null;
	email?: string | null;
}

const compact = (text: string) => text.toLowerCase().replace(/[^\p{L}\p{N}]+/gu, '');

/** The owner's name and address and their parts, as the estimator's own dictionary. */
function ownWords(owner: PasswordOwner): string[] {
	const words = new Set<string>();
	const add = (word: string | undefined) => {
		const w = word?.trim().toLowerCase();
		if (w && w.length >= 3) words.add(w);
	};
	const email = owner.email ?? '';
	const [local = '', domain = ''] = email.split('@');
	add(email);
	add(local);
	add(compact(local));
	for (const part of local.split(/[._+-]+/)) add(part);
	// The domain's labels but the last (`example` of `example.com`).
	for (const label of domain.split('.').slice(0, -1)) add(label);
	const name = owner.name ?? '';
	add(name);
	add(compact(name));
	for (const part of name.split(/[\s.,'’-]+/)) add(part);
	return [...words];
}

/** Why the estimator finds a password easy, in the words of the refusal. */
function reasonOf(result: ZxcvbnResult, owner: PasswordOwner): string {
	const matches = result.sequence as Match[];
	const own = new Set(ownWords(owner));
	const dictionaryFrom = (names: string[]) =>
		matches.some((m) => m.pattern === 'dictionary' && names.includes(m.dictionaryName));
	const userWords = matches.filter(
		(m) => m.pattern === 'dictionary' && m.dictionaryName === 'userInputs'
	);
	if (userWords.some((m) => own.has(m.matchedWord))) {
		return 'Too easy to guess: it is built on your name or e-mail address.';
	}
	if (userWords.length > 0) return 'Too easy to guess: it is built on the name of this site.';
	if (dictionaryFrom(['passwords-common'])) {
		return 'Too easy to guess: it is one of the most common passwords, or close to one.';
	}
	if (matches.some((m) => m.pattern === 'spatial')) {
		return 'Too easy to guess: it follows a keyboard pattern.';
	}
	if (matches.some((m) => m.pattern === 'repeat')) {
		return 'Too easy to guess: it repeats a character or a short run of them.';
	}
	if (matches.some((m) => m.pattern === 'sequence')) {
		return 'Too easy to guess: it is a run such as abcd or 1234.';
	}
	if (matches.some((m) => m.pattern === 'date' || m.pattern === 'regex')) {
		return 'Too easy to guess: it is built on a date or a year.';
	}
	return 'Too easy to guess: it is made of a few common words or names.';
}

/**
 * Check a new password against the whole rule: length, then how hard it is to guess, its
 * owner's name and address counting as words anyone would try.
 *
 * @example await checkNewPassword('password12', { email: 'ada@example.com' }) // → { ok: false, message: 'Too easy to guess: it is one of the most common passwords, … Use at least 10 characters …' }
 * @example await checkNewPassword('slide-up-a-fourth', { name: 'Ada', email: 'ada@example.com' }) // → { ok: true }
 */
export async function checkNewPassword(
	password: string,
	owner: PasswordOwner
): Promise<PasswordCheck> {
	const length = checkPasswordLength(password);
	if (!length.ok) return length;
	const typed = compact(password);
	const email = owner.email?.trim().toLowerCase() ?? '';
	if (
		(email && (password.trim().toLowerCase() === email || typed === compact(email))) ||
		(email && typed === compact(email.split('@')[0]))
	) {
		return { ok: false, message: passwordRefusal('Too easy to guess: it is your e-mail address.') };
	}
	if (owner.name && typed === compact(owner.name)) {
		return { ok: false, message: passwordRefusal('Too easy to guess: it is your name.') };
	}
	const result = (await loadEstimator()).check(password, [...SITE_WORDS, ...ownWords(owner)]);
	if (result.score >= MIN_SCORE) return { ok: true };
	return { ok: false, message: passwordRefusal(reasonOf(result, owner)) };
}
