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

/** A signed-in browser or API client. */
export class Session extends Model<InferAttributes<Session>, InferCreationAttributes<Session>> {
	/** SHA-256 hex of the token in the cookie; the token itself is never stored. */
	declare id: string;
	declare userId: ForeignKey<User['id']>;
	declare expiresAt: Date;
	declare createdAt: CreationOptional<Date>;
}

export function initSession(sequelize: Sequelize): void {
	bindTable(Session, sequelize, 'sessions', 'created', {
		id: hashKey(),
		expiresAt: { type: DataTypes.DATE, allowNull: false }
	});
}
