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
import type { Card } from './card';
import type { User } from './user';

/** A note in the thread between a learner and their teacher about one card. */
export class Comment extends Model<InferAttributes<Comment>, InferCreationAttributes<Comment>> {
	declare id: CreationOptional<string>;
	declare cardId: ForeignKey<Card['id']>;
	declare authorId: ForeignKey<User['id']>;
	declare text: string;
	/** When the other party first saw it. */
	declare seenAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
}

export function initComment(sequelize: Sequelize): void {
	bindTable(Comment, sequelize, 'comments', 'created', {
		id: uuidKey(),
		text: { type: DataTypes.TEXT, allowNull: false },
		seenAt: { type: DataTypes.DATE, allowNull: true }
	});
}
