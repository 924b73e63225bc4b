import { z } from 'zod';

/**
 * The account rules a form and the server share: roles, what an e-mail address, a name and a
 * password must be, and one zod schema per account form. Pure (no Kit, no database), so a page
 * imports the same limits and messages its action checks.
 */

export const ROLES = ['learner', 'teacher', 'admin'] as const;
export type Role = (typeof ROLES)[number];

/** Roles a person may choose at sign-up; admins are made by another admin or the CLI. */
export const SIGN_UP_ROLES = ['learner', 'teacher'] as const satisfies readonly Role[];

export const MAX_EMAIL_LENGTH = 254;
export const MAX_NAME_LENGTH = 100;
export const MIN_PASSWORD_LENGTH = 10;
export const MAX_PASSWORD_LENGTH = 200;
/**
 * How long a mailed link works: what the server stores as the token's expiry, and what the mails
 * and pages say.
 */
export const LINK_LIFETIME_MS = {
	verify: 24 * 60 * 60 * 1000,
	reset: 60 * 60 * 1000
} as const;
export const VERIFY_LINK_HOURS = LINK_LIFETIME_MS.verify / 3_600_000;
export const RESET_LINK_MINUTES = LINK_LIFETIME_MS.reset / 60_000;

/** Longer than this, a typed password is refused before it costs an argon2 hash. */
export const MAX_TYPED_PASSWORD_LENGTH = 1000;

/**
 * The password rule in one sentence: the hint under every new-password field, and the second
 * half of every refusal, whose first half says what was wrong with the password typed. The
 * length is checked here; "hard to guess" by the server (`$lib/server/auth/password-strength`),
 * which holds the dictionaries the browser should not download.
 */
export const PASSWORD_RULE = `Use at least ${MIN_PASSWORD_LENGTH} characters that are hard to guess: not a common password or keyboard pattern, not your name or e-mail address. A few unrelated words work well.`;
/** The hint under new-password fields: the rule itself. */
export const PASSWORD_HINT = PASSWORD_RULE;

/**
 * A refusal of a new password: why, then the rule.
 * @example passwordRefusal('Too short: 7 characters.') // → 'Too short: 7 characters. Use at least 10 characters that …'
 */
export function passwordRefusal(why: string): string {
	return `${why} ${PASSWORD_RULE}`;
}

// Deliberately loose: one @, something on each side, a dot in the domain, no spaces. The link we
// mail is the real check.
const EMAIL_PATTERN = /^[^\s@<>()[\],;:"]+@[^\s@<>()[\],;:"]+\.[^\s@<>()[\],;:".]+$/;
// eslint-disable-next-line no-control-regex
const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f]/;

/**
 * The address as we store and compare it, or null when it is not one.
 *
 * @example normalizeEmail('  Ada@Example.COM ') // → 'ada@example.com'
 */
export function normalizeEmail(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	const email = value.trim().toLowerCase();
	if (email.length > MAX_EMAIL_LENGTH || !EMAIL_PATTERN.test(email)) return null;
	return email;
}

/**
 * A display name with runs of white space made one space, or null when empty, too long or holding
 * control characters.
 * @example normalizeName('  Ada   Lovelace ') // → 'Ada Lovelace'
 */
export function normalizeName(value: unknown): string | null {
	if (typeof value !== 'string') return null;
	const name = value.trim().replace(/\s+/g, ' ');
	if (name.length === 0 || name.length > MAX_NAME_LENGTH || CONTROL_CHARACTERS.test(name)) {
		return null;
	}
	return name;
}

export type PasswordCheck = { ok: true } | { ok: false; message: string };

/**
 * The part of the rule that needs no dictionary: 10 to 200 characters. Whether the password is
 * hard to guess is the server's check (`checkNewPassword`), run after this one.
 *
 * @example checkPasswordLength('slide-up-a-fourth') // → { ok: true }
 */
export function checkPasswordLength(password: string): PasswordCheck {
	if (password.length < MIN_PASSWORD_LENGTH) {
		const count = [...password].length;
		return {
			ok: false,
			message: passwordRefusal(`Too short: ${count} ${count === 1 ? 'character' : 'characters'}.`)
		};
	}
	if (password.length > MAX_PASSWORD_LENGTH) {
		return {
			ok: false,
			message: passwordRefusal(
				`Too long: we keep passwords of up to ${MAX_PASSWORD_LENGTH} characters.`
			)
		};
	}
	return { ok: true };
}

/** A text field that is missing or not text gets the field's own message, not zod's. */
const text = (message: string) => z.string({ error: message });

const emailField = (message: string) =>
	text(message).refine((value) => normalizeEmail(value) !== null, message);

const newPasswordField = (missing: string) =>
	text(missing)
		.min(1, missing)
		.superRefine((password, ctx) => {
			const check = checkPasswordLength(password);
			if (!check.ok) ctx.addIssue({ code: 'custom', message: check.message });
		});

const typedPasswordField = (missing: string) =>
	text(missing)
		.min(1, missing)
		.max(MAX_TYPED_PASSWORD_LENGTH, 'That password is far longer than any we accept.');

/** Sign-up: a new account. */
export const signUpSchema = z.object({
	name: text(`Enter a name of 1 to ${MAX_NAME_LENGTH} characters.`).refine(
		(value) => normalizeName(value) !== null,
		`Enter a name of 1 to ${MAX_NAME_LENGTH} characters.`
	),
	email: emailField('Enter an e-mail address such as name@example.com.'),
	password: newPasswordField('Enter a password.'),
	role: z
		.enum(SIGN_UP_ROLES, { error: 'Choose whether you join as a learner or as a teacher.' })
		.default('learner')
});

/** Sign-in; `next` is the page to go on to (checked by the server, never trusted). */
export const signInSchema = z.object({
	email: emailField('Enter the e-mail address you signed up with.'),
	password: typedPasswordField('Enter your password.'),
	next: z.string().max(2000).default('')
});

/** Asking for a password reset link. */
export const forgotPasswordSchema = z.object({
	email: emailField('Enter an e-mail address such as name@example.com.')
});

/** A new password from a mailed reset link; the token travels in a hidden field. */
export const resetPasswordSchema = z
	.object({
		token: z.string().max(200).default(''),
		password: newPasswordField('Enter a new password.'),
		confirm: text('Enter the new password again.')
	})
	.refine((form) => form.password === form.confirm, {
		path: ['confirm'],
		message: 'The two passwords are not the same.'
	});

/** Changing the password while signed in. */
export const changePasswordSchema = z
	.object({
		currentPassword: typedPasswordField('Enter your current password.'),
		password: newPasswordField('Enter a new password.'),
		confirm: text('Enter the new password again.')
	})
	.refine((form) => form.password === form.confirm, {
		path: ['confirm'],
		message: 'The two new passwords are not the same.'
	})
	.refine((form) => form.password !== form.currentPassword, {
		path: ['password'],
		message: 'Choose a password different from the current one.'
	});

/** Deleting one's own account: the address typed out and the password. */
export const deleteAccountSchema = z.object({
	confirmEmail: text('Type your e-mail address exactly to confirm; nothing was deleted.'),
	deletePassword: typedPasswordField('Enter your password to confirm.')
});

/** An admin gives an account a role. */
export const setRoleSchema = z.object({
	email: emailField('Give the e-mail address of the account.'),
	role: z.enum(ROLES, { error: 'Choose learner, teacher or admin.' })
});

export type SignUpForm = z.infer<typeof signUpSchema>;
export type SignInForm = z.infer<typeof signInSchema>;
export type ResetPasswordForm = z.infer<typeof resetPasswordSchema>;
export type ChangePasswordForm = z.infer<typeof changePasswordSchema>;
export type DeleteAccountForm = z.infer<typeof deleteAccountSchema>;
export type SetRoleForm = z.infer<typeof setRoleSchema>;
