import { renderMail, type MailContent } from './layout';

export interface ClassInvitationMailInput {
	/** The inviting teacher's display name; escaped by the layout. */
	teacherName: string;
	className: string;
	/** Absolute link carrying the invitation token. */
	url: string;
	/** Days the link keeps working. */
	days: number;
}

/**
 * A teacher's invitation to a class. The link works with or without an account: it offers
 * sign-up to a newcomer and lands them in the class.
 * @example classInvitationMail({ teacherName: 'Rosa', className: 'Tuesday combo', url, days: 14 }).subject // 'Rosa invites you to Tuesday combo on Twelvefold'
 */
export function classInvitationMail(input: ClassInvitationMailInput): MailContent {
	return renderMail({
		subject: `${input.teacherName} invites you to ${input.className} on Twelvefold`,
		greeting: 'Hello,',
		blocks: [
			{
				kind: 'paragraph',
				text: `${input.teacherName} has invited you to the class "${input.className}". In the class you get the decks of licks your teacher assigns, a few new ones a day in a short daily drill, and your teacher sees which keys need work.`
			},
			{ kind: 'action', label: 'Join the class', url: input.url },
			{
				kind: 'note',
				text: `No account yet? The link lets you make one and puts you straight in the class. It works for ${input.days} days. If you do not know this teacher, ignore this mail.`
			}
		]
	});
}
