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
import type { ClassGroup } from './class';
import type { User } from './user';

/** An invitation to a class sent by mail; its link carries a token whose SHA-256 is stored. */
export class ClassInvitation extends Model<
	InferAttributes<ClassInvitation>,
	InferCreationAttributes<ClassInvitation>
> {
	declare id: CreationOptional<string>;
	declare classId: ForeignKey<ClassGroup['id']>;
	declare invitedById: ForeignKey<User['id']>;
	declare email: string;
	declare tokenHash: string;
	declare expiresAt: Date;
	declare acceptedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
}

export function initClassInvitation(sequelize: Sequelize): void {
	bindTable(ClassInvitation, sequelize, 'class_invitations', 'created', {
		id: uuidKey(),
		email: { type: DataTypes.STRING(254), allowNull: false },
		tokenHash: { type: DataTypes.STRING(64), allowNull: false },
		expiresAt: { type: DataTypes.DATE, allowNull: false },
		acceptedAt: { type: DataTypes.DATE, allowNull: true }
	});
}
