import { RESET_LINK_MINUTES, VERIFY_LINK_HOURS } from '../../../forms/account';
import { renderMail, type MailContent } from './layout';

/** Values the account mails need; `url` carries the one-time token. */
export interface AccountMailInput {
	/**
	 * The recipient's display name as they typed it (escaped by the layout), or null when the
	 * address is not confirmed: a name is text from whoever signed up, and an address that has
	 * agreed to nothing gets none of it.
	 */
	name: string | null;
	/** Absolute link with the token, e.g. `https://…/verify?token=…`. */
	url: string;
}

function greet(name: string | null): string {
	const trimmed = name?.trim();
	return trimmed ? `Hello ${trimmed},` : 'Hello,';
}

/**
 * The mail sent after sign-up: one link that confirms the address. It goes to an address that
 * has agreed to nothing yet, so it carries no text the person signing up typed (not even the
 * name): only our own words and the link.
 * @example verificationMail({ url: 'https://x.test/verify?token=t' }).subject // 'Confirm your e-mail address for Twelvefold'
 */
export function verificationMail({ url }: { url: string }): MailContent {
	return renderMail({
		subject: 'Confirm your e-mail address for Twelvefold',
		greeting: greet(null),
		blocks: [
			{
				kind: 'paragraph',
				text: 'Welcome to Twelvefold. Before your first drill, please confirm that this address is yours.'
			},
			{ kind: 'action', label: 'Confirm my address', url },
			{
				kind: 'note',
				text: `The link works once, for ${VERIFY_LINK_HOURS} hours. If you did not create an account, ignore this mail and nothing will happen.`
			}
		]
	});
}

/**
 * The mail sent when someone asks to reset a password: one link to choose a new one.
 * @example passwordResetMail({ name: 'Ada', url: 'https://x.test/reset?token=t' }).subject // 'Choose a new Twelvefold password'
 */
export function passwordResetMail({ name, url }: AccountMailInput): MailContent {
	return renderMail({
		subject: 'Choose a new Twelvefold password',
		greeting: greet(name),
		blocks: [
			{
				kind: 'paragraph',
				text: 'Someone, hopefully you, asked to reset the password of your Twelvefold account. Follow the link to choose a new one.'
			},
			{ kind: 'action', label: 'Choose a new password', url },
			{
				kind: 'note',
				text: `The link works once, for ${RESET_LINK_MINUTES} minutes. If you did not ask for this, ignore this mail: your password stays as it is.`
			}
		]
	});
}

export interface PasswordChangedMailInput {
	/** As in `AccountMailInput`: null when the address is not confirmed. */
	name: string | null;
	/** `changed` on the settings page with the old password; `reset` through a mailed link. */
	how: 'changed' | 'reset';
	/** When it happened. */
	at: Date;
	/** Absolute link to the page that mails a reset link (`/forgot-password`). */
	resetUrl: string;
}

/**
 * Tells the owner that their password was changed or reset, and what to do if it was not them.
 * @example passwordChangedMail({ name: 'Ada', how: 'changed', at, resetUrl }).subject // 'Your Twelvefold password was changed'
 */
export function passwordChangedMail({
	name,
	how,
	at,
	resetUrl
}: PasswordChangedMailInput): MailContent {
	const when = `${at.toISOString().slice(0, 10)} at ${at.toISOString().slice(11, 16)} UTC`;
	const what =
		how === 'changed'
			? `The password of your Twelvefold account was changed on the settings page on ${when}. Every other device signed in to the account was signed out.`
			: `The password of your Twelvefold account was reset on ${when}, through a link mailed to this address. Every device signed in to the account was signed out.`;
	const notYou =
		how === 'changed'
			? 'If it was not you, someone knows your password. Choose a new one now with a reset link mailed to this address: it signs out every device, the other person’s too.'
			: 'If it was not you, someone can read this mailbox. Change the mailbox’s own password first, then choose a new Twelvefold password with a fresh reset link: it signs out every device, the other person’s too.';
	return renderMail({
		subject: `Your Twelvefold password was ${how}`,
		greeting: greet(name),
		blocks: [
			{ kind: 'paragraph', text: what },
			{ kind: 'paragraph', text: 'If it was you, there is nothing more to do.' },
			{ kind: 'paragraph', text: notYou },
			{ kind: 'action', label: 'Mail me a reset link', url: resetUrl },
			{
				kind: 'note',
				text: 'We never ask for your password by mail. This mail is sent whenever the password changes and cannot be turned off.'
			}
		]
	});
}
