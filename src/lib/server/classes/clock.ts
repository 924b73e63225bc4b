import { Op } from 'sequelize';
import { getDb } from '../db/index';
import { User } from '../db/models/index';
import { settingsOf } from '../study/settings';

/**
 * Each learner's practice clock (zone, day-start hour, key order), read once per page for the
 * members shown. Settings go through `settingsOf`, as everywhere else.
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
	const rows = await User.findAll({ where: { id: { [Op.in]: userIds } } });
	for (const row of rows) {
		const settings = settingsOf(row);
		out.set(row.id, {
			userId: row.id,
			name: row.name,
			timezone: settings.timezone,
			dayStartHour: settings.dayStartHour,
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
