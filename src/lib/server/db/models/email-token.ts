import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { bindTable, hashKey } from './table';
import type { User } from './user';

export const TOKEN_PURPOSES = ['verify', 'reset'] as const;
export type TokenPurpose = (typeof TOKEN_PURPOSES)[number];

/** A single-use link sent by mail (address verification, password reset). */
export class EmailToken extends Model<
	InferAttributes<EmailToken>,
	InferCreationAttributes<EmailToken>
> {
	/** SHA-256 hex of the token in the link; the token itself is never stored. */
	declare id: string;
	declare userId: ForeignKey<User['id']>;
	declare purpose: TokenPurpose;
	declare expiresAt: Date;
	/** Set when the link is used; a used token never works again. */
	declare usedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
}

export function initEmailToken(sequelize: Sequelize): void {
	bindTable(EmailToken, sequelize, 'email_tokens', 'created', {
		id: hashKey(),
		// A string with a CHECK in the database (migration 0003), never an ENUM.
		purpose: {
			type: DataTypes.STRING(16),
			allowNull: false,
			validate: { isIn: [TOKEN_PURPOSES as unknown as string[]] }
		},
		expiresAt: { type: DataTypes.DATE, allowNull: false },
		usedAt: { type: DataTypes.DATE, allowNull: true }
	});
}
