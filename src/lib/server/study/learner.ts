/**
 * What the drill needs to know about a learner: their clock (zone and day-start hour), their
 * instrument, retention, daily minutes, key order and new-card pace. Read once per request.
 */
import { QueryTypes } from 'sequelize';
import { normalizeSettings, type UserSettings } from '../auth/settings';
import { getDb } from '../db/index';
import { DEFAULT_NEW_PER_DAY } from '../../practice/queue';
import { practiceDay, dayBounds } from '../../practice/day';

/** Who is acting: at least an id; the settings when the session already holds them. */
export interface Actor {
	id: string;
	settings?: UserSettings;
}

export interface Learner {
	id: string;
	name: string;
	timeZone: string;
	dayStartHour: number;
	instrument: string;
	desiredRetention: number;
	dailyMinutes: number;
	keyOrder: 'weighted' | 'fourths';
	newPerDay: number;
}

/** A learner's settings and clock; null when the account does not exist. */
export async function loadLearner(actor: Actor | string): Promise<Learner | null> {
	const id = typeof actor === 'string' ? actor : actor.id;
	const rows = await getDb().query<{ name: string; settings: unknown; day_start_hour: number }>(
		'SELECT name, settings, day_start_hour FROM users WHERE id = :id',
		{ replacements: { id }, type: QueryTypes.SELECT }
	);
	if (rows.length === 0) return null;
	const row = rows[0];
	const settings =
		typeof actor !== 'string' && actor.settings ? actor.settings : normalizeSettings(row.settings);
	// A per-learner pace may join the settings later; until then everyone has the default.
	const pace = (settings as Partial<{ newPerDay: unknown }>).newPerDay;
	return {
		id,
		name: row.name,
		timeZone: settings.timezone,
		dayStartHour: Number.isInteger(row.day_start_hour) ? row.day_start_hour : 4,
		instrument: settings.instrument,
		desiredRetention: settings.desiredRetention,
		dailyMinutes: settings.dailyMinutes,
		keyOrder: settings.keyOrder,
		newPerDay:
			typeof pace === 'number' && Number.isInteger(pace) && pace >= 0 && pace <= 50
				? pace
				: DEFAULT_NEW_PER_DAY
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
