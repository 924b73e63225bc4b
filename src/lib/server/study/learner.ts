/**
 * What the drill needs to know about a learner: their clock (zone and day-start hour), their
 * instrument, retention, daily minutes, key order and new-card pace. Read once per request.
 */
import type { UserSettings } from '../../practice/settings';
import { dayBounds, practiceDay } from '../../practice/day';
import { readSettings } from './settings';

/** Who is acting: at least an id; the settings when the session already holds them. */
export interface Actor {
	id: string;
	settings?: UserSettings;
}

export interface Learner {
	id: string;
	timeZone: string;
	dayStartHour: number;
	instrument: string;
	desiredRetention: number;
	dailyMinutes: number;
	keyOrder: 'weighted' | 'fourths';
	newPerDay: number;
}

/**
 * A learner's settings and clock, from the session when it holds them (no query), else from
 * the database; null when the account does not exist.
 */
export async function loadLearner(actor: Actor | string): Promise<Learner | null> {
	const id = typeof actor === 'string' ? actor : actor.id;
	const settings =
		typeof actor !== 'string' && actor.settings ? actor.settings : await readSettings(id);
	if (!settings) return null;
	return {
		id,
		timeZone: settings.timezone,
		dayStartHour: settings.dayStartHour,
		instrument: settings.instrument,
		desiredRetention: settings.desiredRetention,
		dailyMinutes: settings.dailyMinutes,
		keyOrder: settings.keyOrder,
		newPerDay: settings.newPerDay
	};
}

/**
 * The learner's practice day at `now` and when it ends.
 * @example learnerDay(learner, new Date()) // { day: '2026-03-01', start, end }
 */
export function learnerDay(learner: Learner, now: Date): { day: string; start: Date; end: Date } {
	const day = practiceDay(now, learner.timeZone, learner.dayStartHour);
	return { day, ...dayBounds(day, learner.timeZone, learner.dayStartHour) };
}
