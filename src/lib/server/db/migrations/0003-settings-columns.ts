import { QueryTypes } from 'sequelize';
import type { Migration } from './types';

/**
 * The settings the server queries move out of the JSON `settings` column into the columns that
 * 0002 added (`timezone`, `digest_hour`, `digest_enabled`, `day_start_hour`): each value a row
 * kept in its JSON is copied into its column when it is valid there, then removed from the JSON,
 * so each setting has one home. A value that would break the column's CHECK stays at the
 * column's default, as the settings reader would have shown it.
 */

const COLUMNS = {
	timezone: 'timezone',
	digestHour: 'digest_hour',
	digestEnabled: 'digest_enabled',
	dayStartHour: 'day_start_hour'
} as const;
type Key = keyof typeof COLUMNS;

function isZone(value: unknown): value is string {
	if (typeof value !== 'string' || value.length === 0 || value.length > 64) return false;
	try {
		new Intl.DateTimeFormat('en', { timeZone: value });
		return true;
	} catch {
		return false;
	}
}

const isHour = (value: unknown): value is number =>
	Number.isInteger(value) && (value as number) >= 0 && (value as number) <= 23;

const VALID: Record<Key, (value: unknown) => boolean> = {
	timezone: isZone,
	digestHour: isHour,
	digestEnabled: (value) => typeof value === 'boolean',
	dayStartHour: isHour
};

function parse(stored: unknown): Record<string, unknown> {
	let value = stored;
	if (typeof value === 'string') {
		try {
			value = JSON.parse(value);
		} catch {
			return {};
		}
	}
	return value && typeof value === 'object' && !Array.isArray(value)
		? (value as Record<string, unknown>)
		: {};
}

export const settingsColumns: Migration = {
	name: '0003-settings-columns',
	async up({ context: qi }) {
		const sequelize = qi.sequelize;
		const rows = await sequelize.query<{ id: string; settings: unknown }>(
			'SELECT id, settings FROM users',
			{ type: QueryTypes.SELECT }
		);
		for (const row of rows) {
			const json = parse(row.settings);
			const sets: string[] = [];
			const replacements: Record<string, unknown> = { id: row.id };
			for (const key of Object.keys(COLUMNS) as Key[]) {
				if (key in json && VALID[key](json[key])) {
					sets.push(`${COLUMNS[key]} = :${key}`);
					replacements[key] = json[key];
				}
				delete json[key];
			}
			replacements.settings = JSON.stringify(json);
			sets.push('settings = :settings');
			await sequelize.query(`UPDATE users SET ${sets.join(', ')} WHERE id = :id`, {
				replacements
			});
		}
	},
	async down({ context: qi }) {
		// Put the column values back into the JSON, where the code before this migration reads them.
		const sequelize = qi.sequelize;
		const rows = await sequelize.query<Record<string, unknown> & { id: string }>(
			'SELECT id, settings, timezone, digest_hour, digest_enabled, day_start_hour FROM users',
			{ type: QueryTypes.SELECT }
		);
		for (const row of rows) {
			const json = parse(row.settings);
			for (const key of Object.keys(COLUMNS) as Key[]) {
				const value = row[COLUMNS[key]];
				json[key] = key === 'digestEnabled' ? Boolean(value) : value;
			}
			await sequelize.query('UPDATE users SET settings = :settings WHERE id = :id', {
				replacements: { id: row.id, settings: JSON.stringify(json) }
			});
		}
	}
};
