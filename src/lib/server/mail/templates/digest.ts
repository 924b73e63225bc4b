import { formatKey, type WeakKey } from '../../../practice/digest';

interface Streak {
	/** Practice days in a row, ending today or yesterday. */
	days: number;
	practisedToday: boolean;
}
import { renderMail, type MailBlock, type MailContent } from './layout';

/**
 * The two scheduled mails: the learner's Daily reminder and the teacher's Weekly class summary.
 * Both take plain values (the digest service gathers them) and render through the one layout, so
 * the HTML and the plain-text part say the same thing.
 */

/** Links every scheduled mail carries. */
export interface ScheduledMailLinks {
	/** The one thing the mail asks for: today's drill, or the teacher's classes. */
	action: string;
	settings: string;
	unsubscribePage: string;
	unsubscribeOneClick: string;
}

export interface DigestMailInput {
	name: string;
	/** The practice day, YYYY-MM-DD. */
	day: string;
	reviewsDue: number;
	newLicks: number;
	minutes: number;
	timedFromOwn: boolean;
	news: {
		assignments: { className: string; deckName: string; teacherName: string; newPerDay: number }[];
		comments: { authorName: string; lickTitle: string; quality: string; text: string }[];
	};
	streak: Streak;
	weakKeys: WeakKey[];
	hasHistory: boolean;
	encouragement: string;
	/** "07:00 (Europe/Berlin)", for the footer's reason. */
	when: string;
	links: ScheduledMailLinks;
}

/**
 * A day as a reader says it.
 * @example formatDay('2026-03-02') // 'Monday 2 March'
 */
export function formatDay(day: string, withWeekday = true): string {
	const [y, m, d] = day.split('-').map(Number);
	return new Intl.DateTimeFormat('en-GB', {
		timeZone: 'UTC',
		weekday: withWeekday ? 'long' : undefined,
		day: 'numeric',
		month: 'long'
	}).format(new Date(Date.UTC(y, m - 1, d)));
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** A comment shortened for a list line, on one line. */
function excerpt(text: string, max = 140): string {
	const flat = text.replace(/\s+/g, ' ').trim();
	return flat.length > max ? `${flat.slice(0, max - 1).trimEnd()}…` : flat;
}

function greet(name: string): string {
	const first = name.trim().split(/\s+/)[0];
	return first ? `Hello ${first},` : 'Hello,';
}

function streakLine(streak: Streak, anythingDue: boolean): string {
	if (streak.practisedToday) {
		return `${plural(streak.days, 'day')} in a row, today included: your streak is kept.`;
	}
	if (streak.days > 0) {
		return anythingDue
			? `${plural(streak.days, 'day')} in a row. Practise today to make it ${streak.days + 1}.`
			: `${plural(streak.days, 'day')} in a row. Nothing is due today, so a short run through any deck keeps it going.`;
	}
	return 'No streak running: today can be day one.';
}

/**
 * The learner's Daily reminder.
 * @example digestMail(input).subject // 'Today: 12 licks, about 9 minutes'
 */
export function digestMail(input: DigestMailInput): MailContent {
	const total = input.reviewsDue + input.newLicks;
	const { assignments, comments } = input.news;
	const newsCount = assignments.length + comments.length;
	const subject =
		total > 0
			? `Today: ${plural(total, 'lick')}, about ${plural(input.minutes, 'minute')}`
			: `New from your teacher: ${plural(newsCount, 'update')}`;

	const blocks: MailBlock[] = [
		{
			kind: 'paragraph',
			text:
				total > 0
					? `Here is your practice for ${formatDay(input.day)}.`
					: `Nothing is due for ${formatDay(input.day)}, but there is news from your teachers.`
		}
	];
	if (total > 0) {
		blocks.push(
			{
				kind: 'facts',
				items: [
					{ label: 'to review', value: String(input.reviewsDue) },
					{ label: 'new today', value: String(input.newLicks) },
					{ label: 'minutes, about', value: String(input.minutes) }
				]
			},
			{
				kind: 'paragraph',
				text: input.timedFromOwn
					? `The minutes are worked out from how long your recent prompts took you.`
					: `The minutes are a first guess until you have played a few prompts; after that they follow your own pace.`
			},
			{ kind: 'action', label: 'Start today’s drill', url: input.links.action }
		);
	}
	if (newsCount > 0) {
		blocks.push(
			{ kind: 'heading', text: 'New from your teachers' },
			{
				kind: 'list',
				items: [
					...assignments.map(
						(a) =>
							`${a.teacherName} assigned “${a.deckName}” in ${a.className}: ${plural(a.newPerDay, 'new lick')} a day.`
					),
					...comments.map(
						(c) => `${c.authorName} on “${c.lickTitle}” (${c.quality}): “${excerpt(c.text)}”`
					)
				]
			}
		);
		if (total === 0)
			blocks.push({ kind: 'action', label: 'Open Twelvefold', url: input.links.action });
	}
	blocks.push(
		{ kind: 'heading', text: 'Your streak' },
		{ kind: 'paragraph', text: streakLine(input.streak, total > 0) }
	);
	if (input.hasHistory) {
		blocks.push({ kind: 'heading', text: 'Keys to give extra time' });
		blocks.push({
			kind: 'note',
			text: 'Strength over the last three months: 100 % is every prompt played with ease.'
		});
		blocks.push(
			input.weakKeys.length
				? {
						kind: 'list',
						items: input.weakKeys.map(
							(k) =>
								`${formatKey(k.key)}: strength ${Math.round(k.strength * 100)}\u00a0% over ${plural(k.reviews, 'prompt')}`
						)
					}
				: { kind: 'paragraph', text: 'No key gave you trouble in the last three months.' }
		);
	}
	blocks.push({ kind: 'paragraph', text: input.encouragement });
	return renderMail({
		subject,
		greeting: greet(input.name),
		blocks,
		unsubscribeUrl: input.links.unsubscribePage,
		oneClickUrl: input.links.unsubscribeOneClick,
		reason: `You get the Daily reminder at ${input.when}; change the hour in Settings (${input.links.settings}).`
	});
}

export interface SummaryMailInput {
	name: string;
	day: string;
	weekStart: string;
	weekEnd: string;
	classes: {
		name: string;
		members: number;
		practised: { name: string; days: number; reviews: number }[];
		behind: { name: string; overdue: number; newWaiting: number; since: string }[];
		weakKeys: WeakKey[];
		waiting: { learnerName: string; lickTitle: string; text: string; day: string }[];
	}[];
	when: string;
	links: ScheduledMailLinks;
}

/**
 * The teacher's Weekly class summary.
 * @example summaryMail(input).subject // 'Your classes, week of 23 February: 2 of 3 practised'
 */
export function summaryMail(input: SummaryMailInput): MailContent {
	const members = input.classes.reduce((n, c) => n + c.members, 0);
	const practised = input.classes.reduce((n, c) => n + c.practised.length, 0);
	const subject = `Your classes, week of ${formatDay(input.weekStart, false)}: ${practised} of ${members} practised`;
	const blocks: MailBlock[] = [
		{
			kind: 'paragraph',
			text: `How your classes practised from ${formatDay(input.weekStart)} to ${formatDay(input.weekEnd)}.`
		}
	];
	for (const group of input.classes) {
		blocks.push({ kind: 'heading', text: group.name });
		if (group.members === 0) {
			blocks.push({ kind: 'paragraph', text: 'Nobody has joined this class yet.' });
			continue;
		}
		blocks.push({
			kind: 'facts',
			items: [
				{ label: 'practised', value: `${group.practised.length} of ${group.members}` },
				{ label: 'fell behind', value: String(group.behind.length) },
				{ label: 'comments waiting', value: String(group.waiting.length) }
			]
		});
		blocks.push({ kind: 'paragraph', text: 'Practised this week:' });
		blocks.push(
			group.practised.length
				? {
						kind: 'list',
						items: group.practised.map(
							(p) => `${p.name}: ${plural(p.days, 'day')}, ${plural(p.reviews, 'prompt')}`
						)
					}
				: { kind: 'paragraph', text: 'Nobody practised this week.' }
		);
		if (group.behind.length) {
			blocks.push({ kind: 'paragraph', text: 'Fell behind:' });
			blocks.push({
				kind: 'list',
				items: group.behind.map((b) =>
					b.overdue > 0
						? `${b.name}: ${plural(b.overdue, 'lick')} overdue, behind since ${formatDay(b.since)}`
						: `${b.name}: not started, ${plural(b.newWaiting, 'new lick')} waiting since ${formatDay(b.since)}`
				)
			});
		}
		if (group.weakKeys.length) {
			blocks.push({
				kind: 'paragraph',
				text: `Weakest keys in the class: ${group.weakKeys
					.map((k) => `${formatKey(k.key)} (strength ${Math.round(k.strength * 100)}\u00a0%)`)
					.join(', ')}.`
			});
		}
		if (group.waiting.length) {
			blocks.push({ kind: 'paragraph', text: 'Comments waiting for your answer:' });
			blocks.push({
				kind: 'list',
				items: group.waiting.map(
					(w) => `${w.learnerName} on “${w.lickTitle}”, ${formatDay(w.day)}: “${excerpt(w.text)}”`
				)
			});
		}
	}
	blocks.push({ kind: 'action', label: 'Open your classes', url: input.links.action });
	return renderMail({
		subject,
		greeting: greet(input.name),
		blocks,
		unsubscribeUrl: input.links.unsubscribePage,
		oneClickUrl: input.links.unsubscribeOneClick,
		reason: `You get the Weekly class summary at ${input.when}; change it in Settings (${input.links.settings}).`
	});
}
