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
import type { Lick } from './lick';
import type { User } from './user';

/**
 * One graded prompt, append-only: kept in full so that FSRS parameters can be fitted to each
 * learner later. Undo marks `undoneAt` and restores the card from `stateBefore`.
 */
export class Review extends Model<InferAttributes<Review>, InferCreationAttributes<Review>> {
	declare id: CreationOptional<string>;
	declare cardId: ForeignKey<Card['id']>;
	declare userId: ForeignKey<User['id']>;
	declare lickId: ForeignKey<Lick['id']>;
	/** Made by the client; unique per learner, so a resend records nothing new. */
	declare clientId: string;
	/** The practice sitting (client-made id). */
	declare sittingId: CreationOptional<string | null>;
	declare reviewedAt: Date;
	/** The learner's practice day, YYYY-MM-DD in their zone from their day-start hour. */
	declare day: string;
	/** 1–4, worst to best. */
	declare grade: number;
	/** Concert key tonic of the prompt. */
	declare key: string;
	declare quality: string;
	declare tempo: CreationOptional<number | null>;
	declare revealMs: CreationOptional<number | null>;
	declare gradeMs: CreationOptional<number | null>;
	/** JSON of the card's stored state before and after the grade. */
	declare stateBefore: string;
	declare stateAfter: string;
	declare undoneAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
}

export function initReview(sequelize: Sequelize): void {
	bindTable(Review, sequelize, 'reviews', 'created', {
		id: uuidKey(),
		clientId: { type: DataTypes.STRING(64), allowNull: false },
		sittingId: { type: DataTypes.STRING(64), allowNull: true },
		reviewedAt: { type: DataTypes.DATE, allowNull: false },
		day: { type: DataTypes.STRING(10), allowNull: false },
		grade: { type: DataTypes.INTEGER, allowNull: false },
		key: { type: DataTypes.STRING(4), allowNull: false },
		quality: { type: DataTypes.STRING(16), allowNull: false },
		tempo: { type: DataTypes.INTEGER, allowNull: true },
		revealMs: { type: DataTypes.INTEGER, allowNull: true },
		gradeMs: { type: DataTypes.INTEGER, allowNull: true },
		stateBefore: { type: DataTypes.TEXT, allowNull: false },
		stateAfter: { type: DataTypes.TEXT, allowNull: false },
		undoneAt: { type: DataTypes.DATE, allowNull: true }
	});
}
