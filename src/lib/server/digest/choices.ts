import { User } from '../db/models/index';

/**
 * Who gets which scheduled mail: the Daily reminder (`digest`) and, for teachers, the Weekly
 * class summary with its weekday. Read and changed here by the settings page, the unsubscribe
 * page and the one-click endpoint alike.
 */

/** The scheduled mails a person can turn off: the daily reminder and the weekly class summary. */
export const MAIL_CHOICES = ['digest', 'summary'] as const;
export type MailChoice = (typeof MAIL_CHOICES)[number];

/** The screen's name of each kind of mail. */
export const MAIL_CHOICE_NAMES: Record<MailChoice, string> = {
	digest: 'Daily reminder',
	summary: 'Weekly class summary'
};

export interface MailChoices {
	digestEnabled: boolean;
	summaryEnabled: boolean;
	/** ISO weekday, 1 Monday … 7 Sunday. */
	summaryWeekday: number;
}

/**
 * A person's mail choices, or null when the account is gone.
 * @example await readMailChoices(user.id) // { digestEnabled: true, summaryEnabled: true, summaryWeekday: 1 }
 */
export async function readMailChoices(userId: string): Promise<MailChoices | null> {
	const user = await User.findByPk(userId, {
		attributes: ['id', 'digestEnabled', 'summaryEnabled', 'summaryWeekday']
	});
	return user
		? {
				digestEnabled: user.digestEnabled,
				summaryEnabled: user.summaryEnabled,
				summaryWeekday: user.summaryWeekday
			}
		: null;
}

/**
 * Turn one kind of scheduled mail on or off for a person (the unsubscribe link, its undo, and
 * the settings form). Answers whether anything changed.
 * @example await setMailChoice(user.id, 'digest', false) // true the first time, false after
 */
export async function setMailChoice(
	userId: string,
	kind: MailChoice,
	enabled: boolean
): Promise<boolean> {
	const user = await User.findByPk(userId);
	if (!user) return false;
	const current = kind === 'digest' ? user.digestEnabled : user.summaryEnabled;
	if (current === enabled) return false;
	if (kind === 'digest') user.digestEnabled = enabled;
	else user.summaryEnabled = enabled;
	await user.save();
	return true;
}

/**
 * The Weekly class summary's choice from the settings form (already validated by its schema).
 * @example await setSummaryChoice(user.id, { summaryEnabled: true, summaryWeekday: 5 }) // true
 */
export async function setSummaryChoice(
	userId: string,
	choice: { summaryEnabled: boolean; summaryWeekday: number }
): Promise<boolean> {
	const [changed] = await User.update(
		{ summaryEnabled: choice.summaryEnabled, summaryWeekday: choice.summaryWeekday },
		{ where: { id: userId } }
	);
	return changed > 0;
}
