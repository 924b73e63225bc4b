import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { bindTable, uuidKey } from './table';
import type { User } from './user';

export const MAIL_KINDS = ['digest', 'summary'] as const;
export type MailKind = (typeof MAIL_KINDS)[number];
export const MAIL_SEND_STATUSES = ['claimed', 'sent', 'failed', 'skipped'] as const;
export type MailSendStatus = (typeof MAIL_SEND_STATUSES)[number];

/**
 * The claim on one scheduled mail: unique per person, kind and local day, inserted in the same
 * transaction that decides to send, so two processes never both send it.
 */
export class MailSend extends Model<InferAttributes<MailSend>, InferCreationAttributes<MailSend>> {
	declare id: CreationOptional<string>;
	declare userId: ForeignKey<User['id']>;
	declare kind: MailKind;
	/** The recipient's local day, YYYY-MM-DD. */
	declare day: string;
	declare status: MailSendStatus;
	declare attempts: CreationOptional<number>;
	declare nextAttemptAt: CreationOptional<Date | null>;
	declare lastError: CreationOptional<string | null>;
	declare sentAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initMailSend(sequelize: Sequelize): void {
	bindTable(MailSend, sequelize, 'mail_sends', 'created-updated', {
		id: uuidKey(),
		kind: { type: DataTypes.STRING(16), allowNull: false },
		day: { type: DataTypes.STRING(10), allowNull: false },
		status: { type: DataTypes.STRING(16), allowNull: false },
		attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		nextAttemptAt: { type: DataTypes.DATE, allowNull: true },
		lastError: { type: DataTypes.TEXT, allowNull: true },
		sentAt: { type: DataTypes.DATE, allowNull: true }
	});
}
