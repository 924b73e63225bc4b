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
	bindTable(LickVersion, sequelize, 'lick_versions', 'created-updated', {
		id: uuidKey(),
		quality: { type: DataTypes.STRING(16), allowNull: false },
		abc: { type: DataTypes.TEXT, allowNull: false }
	});
}
