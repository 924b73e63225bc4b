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
/** Longer than this, a typed password is refused before it costs an argon2 hash. */
export const MAX_TYPED_PASSWORD_LENGTH = 1000;

/** What the password fields of a new password say under themselves. */
export const PASSWORD_HINT = `At least ${MIN_PASSWORD_LENGTH} characters, mixing two kinds: letters, digits or symbols.`;

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

/** A text field that is missing or not text gets the field's own message, not zod's. */
const text = (message: string) => z.string({ error: message });

const emailField = (message: string) =>
	text(message).refine((value) => normalizeEmail(value) !== null, message);

const newPasswordField = (missing: string) =>
	text(missing)
		.min(1, missing)
		.superRefine((password, ctx) => {
			const check = checkPasswordStrength(password);
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
