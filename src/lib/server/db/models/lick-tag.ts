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
import type { Lick } from './lick';

/** One tag of a lick: a device name of the trade or a free word, lower-case. */
export class LickTag extends Model<InferAttributes<LickTag>, InferCreationAttributes<LickTag>> {
	declare id: CreationOptional<number>;
	declare lickId: ForeignKey<Lick['id']>;
	declare tag: string;
}

export function initLickTag(sequelize: Sequelize): void {
	bindTable(LickTag, sequelize, 'lick_tags', 'none', {
		id: serialKey(),
		tag: { type: DataTypes.STRING(40), allowNull: false }
	});
}
