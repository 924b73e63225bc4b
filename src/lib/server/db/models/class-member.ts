import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import { bindTable, serialKey } from './table';
import type { ClassGroup } from './class';
import type { User } from './user';

/** A learner's membership of a class (unique class, user). Leaving deletes it; reviews stay. */
export class ClassMember extends Model<
	InferAttributes<ClassMember>,
	InferCreationAttributes<ClassMember>
> {
	declare id: CreationOptional<number>;
	declare classId: ForeignKey<ClassGroup['id']>;
	declare userId: ForeignKey<User['id']>;
	declare joinedAt: Date;
}

export function initClassMember(sequelize: Sequelize): void {
	bindTable(ClassMember, sequelize, 'class_members', 'none', {
		id: serialKey(),
		joinedAt: { type: DataTypes.DATE, allowNull: false }
	});
}
