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

/** A teacher's hand-written version of a lick for one chord quality, used instead of the re-mapping. */
export class LickVersion extends Model<
	InferAttributes<LickVersion>,
	InferCreationAttributes<LickVersion>
> {
	declare id: CreationOptional<string>;
	declare lickId: ForeignKey<Lick['id']>;
	/** Engine quality id; one version per lick and quality (unique). */
	declare quality: string;
	declare abc: string;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initLickVersion(sequelize: Sequelize): void {
	LickVersion.init(
		{
			id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
			quality: { type: DataTypes.STRING(16), allowNull: false },
			abc: { type: DataTypes.TEXT, allowNull: false },
			createdAt: DataTypes.DATE,
			updatedAt: DataTypes.DATE
		},
		{ sequelize, tableName: 'lick_versions', underscored: true }
	);
}
