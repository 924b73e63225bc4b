import { renderMail, type MailContent } from './layout';

/** Values the account mails need; `url` carries the one-time token. */
export interface AccountMailInput {
	/** The recipient's display name as they typed it; escaped by the layout. */
	name: string;
	/** Absolute link with the token, e.g. `https://…/verify?token=…`. */
	url: string;
}

function greet(name: string): string {
	const trimmed = name.trim();
	return trimmed ? `Hello ${trimmed},` : 'Hello,';
}

/**
 * The mail sent after sign-up: one link that confirms the address.
 * @example verificationMail({ name: 'Ada', url: 'https://x.test/verify?token=t' }).subject // 'Confirm your e-mail address for Twelvefold'
 */
export function verificationMail({ name, url }: AccountMailInput): MailContent {
	return renderMail({
		subject: 'Confirm your e-mail address for Twelvefold',
		greeting: greet(name),
		blocks: [
			{
				kind: 'paragraph',
				text: 'Welcome to Twelvefold. Before your first drill, please confirm that this address is yours.'
			},
			{ kind: 'action', label: 'Confirm my address', url },
			{
				kind: 'note',
				text: 'The link works once and expires after a while. If you did not create an account, ignore this mail and nothing will happen.'
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
				text: 'The link works once and expires soon. If you did not ask for this, ignore this mail: your password stays as it is.'
			}
		]
	});
}
