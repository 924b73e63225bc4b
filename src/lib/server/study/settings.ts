import type { Transaction } from 'sequelize';
import { User } from '../db/models/index';
import { normalizeSettings, readSettingsInput, type UserSettings } from '../../practice/settings';

/**
 * Where a learner's practice settings are kept. The ones the server queries across users (the
 * digest's "whose hour has come", the drill's day boundary) are indexed columns on `users`; the
 * others live in the JSON `settings` column. Rules (defaults, limits, reading of input) are the
 * pure `$lib/practice/settings.ts`; this module only stores and loads.
 */

/** Settings kept as columns of `users`, under the same names as on the model. */
type ColumnSetting = 'timezone' | 'digestHour' | 'digestEnabled' | 'dayStartHour';

/** The settings stored as columns (what a `User.create` or `update` takes). */
export type SettingsColumns = Pick<UserSettings, ColumnSetting> & {
	settings: Omit<UserSettings, ColumnSetting>;
};

/**
 * A user row's settings, columns and JSON put together and normalised (a stored value that no
 * longer passes falls back to its default, so a row always loads).
 * @example settingsOf(row) // → { timezone: 'Europe/Berlin', instrument: 'piano', dayStartHour: 4, … }
 */
export function settingsOf(row: User): UserSettings {
	const stored = row.settings && typeof row.settings === 'object' ? row.settings : {};
	return normalizeSettings({
		...stored,
		timezone: row.timezone,
		digestHour: row.digestHour,
		digestEnabled: row.digestEnabled,
		dayStartHour: row.dayStartHour
	});
}

/**
 * The attributes that store `settings` on a user row: queried settings as columns, the rest as
 * the JSON column (without the column ones, so there is one copy of each).
 * @example toSettingsColumns(DEFAULT_SETTINGS) // → { timezone: 'UTC', digestHour: 7, …, settings: { instrument: 'concert', … } }
 */
export function toSettingsColumns(settings: UserSettings): SettingsColumns {
	const { timezone, digestHour, digestEnabled, dayStartHour, ...rest } = settings;
	return { timezone, digestHour, digestEnabled, dayStartHour, settings: rest };
}

export type UpdateSettingsResult =
	| { ok: true; settings: UserSettings }
	| { ok: false; reason: 'invalid'; field: keyof UserSettings; message: string }
	| { ok: false; reason: 'not-found'; message: string };

/**
 * Replace a learner's practice settings with the submitted ones, all checked strictly by
 * `readSettingsInput`; a refused field changes nothing.
 *
 * @example await updateSettings(user.id, { instrument: 'alto-sax', dailyMinutes: '20', … })
 * // → { ok: true, settings: { instrument: 'alto-sax', dailyMinutes: 20, … } }
 */
export async function updateSettings(
	userId: string,
	input: unknown,
	transaction?: Transaction
): Promise<UpdateSettingsResult> {
	const read = readSettingsInput(input);
	if (!read.ok) return { ok: false, reason: 'invalid', field: read.field, message: read.message };
	const [count] = await User.update(toSettingsColumns(read.settings), {
		where: { id: userId },
		transaction
	});
	if (count === 0) {
		return { ok: false, reason: 'not-found', message: 'This account no longer exists.' };
	}
	return { ok: true, settings: read.settings };
}

/**
 * One learner's stored settings, or null when the account is gone. For services that act for
 * someone other than the signed-in user (the digest); pages read `locals.user.settings`.
 * @example await readSettings(user.id) // → { timezone: 'UTC', newPerDay: 5, … }
 */
export async function readSettings(
	userId: string,
	transaction?: Transaction
): Promise<UserSettings | null> {
	const row = await User.findByPk(userId, { transaction });
	return row ? settingsOf(row) : null;
}
