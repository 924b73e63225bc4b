import {
	DataTypes,
	Model,
	type CreationOptional,
	type ForeignKey,
	type InferAttributes,
	type InferCreationAttributes,
	type Sequelize
} from 'sequelize';
import type { Lick } from './lick';

/** One tag of a lick: a device name of the trade or a free word, lower-case. */
export class LickTag extends Model<InferAttributes<LickTag>, InferCreationAttributes<LickTag>> {
	declare id: CreationOptional<number>;
	declare lickId: ForeignKey<Lick['id']>;
	declare tag: string;
}

export function initLickTag(sequelize: Sequelize): void {
	LickTag.init(
		{
			id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
			tag: { type: DataTypes.STRING(40), allowNull: false }
		},
		{ sequelize, tableName: 'lick_tags', underscored: true, timestamps: false }
	);
}
