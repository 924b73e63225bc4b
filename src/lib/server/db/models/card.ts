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
import type { User } from './user';

/**
 * What a learner remembers: one per learner, lick and chord quality (unique). Holds ts-fsrs'
 * Card state (without the deprecated `elapsed_days`) and the tempo ladder's rung.
 */
export class Card extends Model<InferAttributes<Card>, InferCreationAttributes<Card>> {
	declare id: CreationOptional<string>;
	declare userId: ForeignKey<User['id']>;
	declare lickId: ForeignKey<Lick['id']>;
	declare quality: string;
	/** Source of the card and of its pace; null when the learner added it. */
	declare assignmentId: CreationOptional<string | null>;
	/** Order among the learner's new cards. */
	declare newPosition: CreationOptional<number>;
	/** Local day it was first shown; null while new. */
	declare introducedDay: CreationOptional<string | null>;
	/** Set when its source stopped; a retired new card is never introduced. */
	declare retiredAt: CreationOptional<Date | null>;
	declare due: Date;
	declare stability: CreationOptional<number>;
	declare difficulty: CreationOptional<number>;
	declare scheduledDays: CreationOptional<number>;
	declare learningSteps: CreationOptional<number>;
	declare reps: CreationOptional<number>;
	declare lapses: CreationOptional<number>;
	/** ts-fsrs State: 0 new, 1 learning, 2 review, 3 relearning. */
	declare state: CreationOptional<number>;
	declare lastReview: CreationOptional<Date | null>;
	/** Tempo ladder: last tempo played well; null before the first good pass. */
	declare tempo: CreationOptional<number | null>;
	/** Compare-and-set counter, bumped on every write. */
	declare version: CreationOptional<number>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initCard(sequelize: Sequelize): void {
	bindTable(Card, sequelize, 'cards', 'created-updated', {
		id: uuidKey(),
		quality: { type: DataTypes.STRING(16), allowNull: false },
		assignmentId: { type: DataTypes.UUID, allowNull: true },
		newPosition: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		introducedDay: { type: DataTypes.STRING(10), allowNull: true },
		retiredAt: { type: DataTypes.DATE, allowNull: true },
		due: { type: DataTypes.DATE, allowNull: false },
		stability: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
		difficulty: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
		scheduledDays: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		learningSteps: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		reps: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		lapses: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		state: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
		lastReview: { type: DataTypes.DATE, allowNull: true },
		tempo: { type: DataTypes.INTEGER, allowNull: true },
		version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 }
	});
}
