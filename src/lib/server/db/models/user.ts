import {
	DataTypes,
	Model,
	type CreationOptional,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { bindTable, uuidKey } from './table';

import { ROLES, type Role } from '../../../forms/account';

export { ROLES, type Role };

/** An account. Rows never leave `$lib/server`: map them with `toSessionUser` or similar. */
export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
	/** Random UUID; the primary key other tables reference (`user_id`, type UUID). */
	declare id: CreationOptional<string>;
	/** Stored lower-cased and trimmed, unique. */
	declare email: string;
	/** Display name shown to teachers and in mails. */
	declare name: string;
	declare role: CreationOptional<Role>;
	/** argon2id PHC string; never sent anywhere. */
	declare passwordHash: string;
	/** When the address was confirmed through the mailed link; null until then. */
	declare emailVerifiedAt: CreationOptional<Date | null>;
	/** IANA zone of the learner's day and reminder (column: queried by the digest). */
	declare timezone: CreationOptional<string>;
	/** Local hour (0–23) of the daily digest mail. */
	declare digestHour: CreationOptional<number>;
	declare digestEnabled: CreationOptional<boolean>;
	/** Local hour (0–23) the practice day starts. */
	declare dayStartHour: CreationOptional<number>;
	/**
	 * The practice settings nobody queries across users (instrument, minutes, key order…), as
	 * stored: loose JSON read through `settingsOf` in `$lib/server/study/settings.ts`.
	 */
	declare settings: CreationOptional<Record<string, unknown>>;
	/** Whether a teacher gets the weekly class summary. */
	declare summaryEnabled: CreationOptional<boolean>;
	/** ISO weekday (1 Monday … 7 Sunday) of the weekly summary. */
	declare summaryWeekday: CreationOptional<number>;
	/** Key that signs this person's unsubscribe links; null until a scheduled mail needs one. */
	declare mailSecret: CreationOptional<string | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initUser(sequelize: Sequelize): void {
	bindTable(User, sequelize, 'users', 'created-updated', {
		id: uuidKey(),
		email: {
			type: DataTypes.STRING(254),
			allowNull: false,
			unique: true,
			set(value: string) {
				this.setDataValue('email', String(value).trim().toLowerCase());
			}
		},
		name: { type: DataTypes.STRING(100), allowNull: false },
		// A string with a CHECK in the database (migration 0003), never an ENUM.
		role: {
			type: DataTypes.STRING(16),
			allowNull: false,
			defaultValue: 'learner',
			validate: { isIn: [ROLES as unknown as string[]] }
		},
		passwordHash: { type: DataTypes.STRING(255), allowNull: false },
		emailVerifiedAt: { type: DataTypes.DATE, allowNull: true },
		timezone: { type: DataTypes.STRING(64), allowNull: false, defaultValue: 'UTC' },
		digestHour: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 7 },
		digestEnabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
		dayStartHour: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 4 },
		settings: { type: DataTypes.JSON, allowNull: false, defaultValue: {} },
		summaryEnabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
		summaryWeekday: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
		mailSecret: { type: DataTypes.STRING(64), allowNull: true }
	});
}
