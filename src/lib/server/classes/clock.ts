import { QueryTypes } from 'sequelize';
import { normalizeSettings } from '../auth/settings';
import { getDb } from '../db/index';

/**
 * Each learner's practice clock (zone, day-start hour, key order), read once per page for the
 * members shown. Settings go through `normalizeSettings`, as everywhere else.
 */
export interface LearnerClock {
	userId: string;
	name: string;
	timezone: string;
	dayStartHour: number;
	keyOrder: string;
}

/** The clocks of `userIds`, by id. */
export async function clocksOf(userIds: string[]): Promise<Map<string, LearnerClock>> {
	const out = new Map<string, LearnerClock>();
	if (userIds.length === 0) return out;
	const rows = await getDb().query<{
		id: string;
		name: string;
		settings: unknown;
		day_start_hour: unknown;
	}>('SELECT id, name, settings, day_start_hour FROM users WHERE id IN (:userIds)', {
		replacements: { userIds },
		type: QueryTypes.SELECT
	});
	for (const row of rows) {
		const settings = normalizeSettings(row.settings);
		const hour = Number(row.day_start_hour);
		out.set(row.id, {
			userId: row.id,
			name: row.name,
			timezone: settings.timezone,
			dayStartHour: Number.isInteger(hour) && hour >= 0 && hour <= 23 ? hour : 4,
			keyOrder: settings.keyOrder
		});
	}
	return out;
}

/**
 * A 'YYYY-MM-DD' text column as a whole day number, in each dialect's own date arithmetic (the
 * two count from different epochs; only differences between days are ever used).
 * @example dayNumberSql('r.day') // "CAST(julianday(r.day) AS INTEGER)" on SQLite
 */
export function dayNumberSql(column: string): string {
	return getDb().getDialect() === 'postgres'
		? `(CAST(${column} AS DATE) - DATE '2000-01-01')`
		: `CAST(julianday(${column}) AS INTEGER)`;
}
