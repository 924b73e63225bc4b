/**
 * Today's queue: due cards, most at risk of being forgotten first (lowest retrievability now),
 * then new cards at the pace their source sets (an assignment's `newPerDay` while it runs, the
 * learner's own `newPerDay` for cards they added), all within the learner's daily minutes. After
 * a break the due cards are capped per day, most at risk first, and the queue says how many days
 * the catch-up takes. Pure: cards, sources, time and the day boundary are passed in.
 */
import { retrievability, type SchedulingState } from './scheduler';

export interface QueueCard extends SchedulingState {
	id: string;
	lickId: string;
	/** Source of the card and its pace: an assignment id, or null for the learner's own. */
	assignmentId: string | null;
	newPosition: number;
	introducedDay: string | null;
	retired: boolean;
}

/** Pace of one source of new cards. */
export interface QueueSource {
	/** New cards a day. */
	newPerDay: number;
	/** False outside its dates or while paused: none of its new cards come. */
	active: boolean;
}

export interface QueueInput {
	now: Date;
	/** Today's practice day. */
	day: string;
	/** When today's practice day ends: anything due before then is due today. */
	dayEnd: Date;
	cards: readonly QueueCard[];
	/** Sources by assignment id; the learner's own cards use `ownSource`. */
	sources: ReadonlyMap<string, QueueSource>;
	ownSource: QueueSource;
	/** New cards already introduced today, by source ('' for the learner's own). */
	introducedToday: ReadonlyMap<string, number>;
	/** Licks with a card introduced today already (at most one a lick a day). */
	licksIntroducedToday: ReadonlySet<string>;
	/** Licks already reviewed today (a due sibling of theirs waits for another day). */
	licksReviewedToday?: ReadonlySet<string>;
	dailyMinutes: number;
	/** Estimated seconds a due card takes (`estimateSecondsPerCard`). */
	secondsPerCard: number;
	desiredRetention?: number;
}

export interface QueueEntry {
	card: QueueCard;
	isNew: boolean;
	/** Probability of recall now; null for a new card. */
	retrievability: number | null;
}

export interface Queue {
	entries: QueueEntry[];
	due: number;
	new: number;
	estimatedMinutes: number;
	/** Cards due today or before (all of them, including those left for later days). */
	overdue: number;
	/** Most due cards shown today. */
	dailyCap: number;
	/** Days the backlog takes at the cap; 0 when everything due fits today. */
	catchUpDays: number;
}

/** A new card takes about three prompts on its first day: taught, then two learning steps. */
export const NEW_CARD_PROMPTS = 3;
/** Seconds a prompt takes before a learner has any history (play from memory, reveal, grade). */
export const DEFAULT_SECONDS_PER_CARD = 45;
/** The learner's own new cards a day unless they set otherwise. */
export const DEFAULT_NEW_PER_DAY = 5;

/**
 * Seconds a prompt takes this learner: the median of their recent prompt times (reveal plus
 * grade), kept between 10 s and 5 min; the default when fewer than five are known.
 * @example estimateSecondsPerCard([30_000, 40_000, 50_000, 60_000, 70_000]) // 50
 */
export function estimateSecondsPerCard(promptMs: readonly number[]): number {
	const usable = promptMs.filter((ms) => Number.isFinite(ms) && ms > 0).sort((a, b) => a - b);
	if (usable.length < 5) return DEFAULT_SECONDS_PER_CARD;
	const mid = usable.length >> 1;
	const median = usable.length % 2 ? usable[mid] : (usable[mid - 1] + usable[mid]) / 2;
	return Math.min(300, Math.max(10, Math.round(median / 1000)));
}

/**
 * Build today's queue.
 * @example buildQueue({ now, day, dayEnd, cards, sources, ownSource, … }).entries[0].card.id
 */
export function buildQueue(input: QueueInput): Queue {
	const { now, dayEnd, secondsPerCard } = input;
	const budgetSeconds = Math.max(1, input.dailyMinutes) * 60;
	const dailyCap = Math.max(1, Math.floor(budgetSeconds / secondsPerCard));
	const reviewedLicks = new Set(input.licksReviewedToday ?? []);

	// Due: not new, due before the day ends. Learning steps (due in minutes) count too.
	const dueCards = input.cards
		.filter((c) => c.state !== 0 && c.due.getTime() < dayEnd.getTime())
		.map((card) => ({
			card,
			isNew: false,
			retrievability: retrievability(card, now, input.desiredRetention)
		}));
	// Most at risk first; a short-term step due later today goes after everything due now.
	dueCards.sort((a, b) => {
		const aLater = a.card.due.getTime() > now.getTime() && a.card.state !== 2 ? 1 : 0;
		const bLater = b.card.due.getTime() > now.getTime() && b.card.state !== 2 ? 1 : 0;
		if (aLater !== bLater) return aLater - bLater;
		if (aLater) return a.card.due.getTime() - b.card.due.getTime();
		return (a.retrievability ?? 0) - (b.retrievability ?? 0) || a.card.id.localeCompare(b.card.id);
	});

	// One review card of a lick a day (siblings spread); learning steps of today always come.
	const due: QueueEntry[] = [];
	for (const entry of dueCards) {
		const inSitting = entry.card.state === 1 || entry.card.state === 3;
		if (!inSitting) {
			if (reviewedLicks.has(entry.card.lickId)) continue;
			reviewedLicks.add(entry.card.lickId);
		}
		due.push(entry);
	}
	const overdue = due.length;
	const shown = due.slice(0, dailyCap);
	const catchUpDays = overdue > dailyCap ? Math.ceil(overdue / dailyCap) : 0;

	let spent = shown.length * secondsPerCard;
	const fresh: QueueEntry[] = [];
	if (catchUpDays === 0) {
		const left = new Map<string, number>();
		const licks = new Set(input.licksIntroducedToday);
		for (const c of shown) licks.add(c.card.lickId);
		const candidates = input.cards
			.filter((c) => c.state === 0 && !c.retired && c.introducedDay === null)
			.slice()
			.sort((a, b) => a.newPosition - b.newPosition || a.id.localeCompare(b.id));
		const cost = secondsPerCard * NEW_CARD_PROMPTS;
		for (const card of candidates) {
			if (spent + cost > budgetSeconds) break;
			const sourceKey = card.assignmentId ?? '';
			const source = card.assignmentId ? input.sources.get(card.assignmentId) : input.ownSource;
			if (!source || !source.active) continue;
			if (!left.has(sourceKey)) {
				left.set(sourceKey, source.newPerDay - (input.introducedToday.get(sourceKey) ?? 0));
			}
			if ((left.get(sourceKey) ?? 0) <= 0 || licks.has(card.lickId)) continue;
			left.set(sourceKey, left.get(sourceKey)! - 1);
			licks.add(card.lickId);
			fresh.push({ card, isNew: true, retrievability: null });
			spent += cost;
		}
	}
	return {
		entries: [...shown, ...fresh],
		due: shown.length,
		new: fresh.length,
		estimatedMinutes: Math.ceil(spent / 60),
		overdue,
		dailyCap,
		catchUpDays
	};
}
