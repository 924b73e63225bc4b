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

/** A teacher's class. (`Class` would shadow nothing in TS, but reads badly: hence `ClassGroup`.) */
export class ClassGroup extends Model<
	InferAttributes<ClassGroup>,
	InferCreationAttributes<ClassGroup>
> {
	declare id: CreationOptional<string>;
	declare teacherId: ForeignKey<User['id']>;
	declare name: string;
	/** Short code a learner types to join; null when turned off. Unique. */
	declare joinCode: CreationOptional<string | null>;
	/** Token of the invite link; null when turned off. Unique. */
	declare joinToken: CreationOptional<string | null>;
	declare archivedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initClassGroup(sequelize: Sequelize): void {
	bindTable(ClassGroup, sequelize, 'classes', 'created-updated', {
		id: uuidKey(),
		name: { type: DataTypes.STRING(120), allowNull: false },
		joinCode: { type: DataTypes.STRING(16), allowNull: true },
		joinToken: { type: DataTypes.STRING(64), allowNull: true },
		archivedAt: { type: DataTypes.DATE, allowNull: true }
	});
}
